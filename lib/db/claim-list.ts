import 'server-only';
import { db } from '@/db/connection';
import { scopeClaims } from '@/lib/db/claims';
import { cappedCount, type PageTotal } from '@/lib/db/paging';
import type { AppUser } from '@/lib/db/users';
import type { ClaimListQuery } from '@/lib/validation/claims';

export type ClaimListRow = {
  id: string;
  number: string;
  stage: string;
  replacementStep: string | null;
  coreStep: string | null;
  brandName: string;
  dealerName: string;
  modelName: string | null;
  frameSerial: string;
  partNumber: string | null;
  partCategory: string | null;
  customerName: string;
  rmaNumber: string | null;
  failureDate: string | null;
  createdAt: string;
  updatedAt: string;
};

const SORTS: Record<ClaimListQuery['sort'], string> = {
  updated: 'c.updated_at',
  created: 'c.created_at',
  number: 'c.number',
  stage: 'c.stage',
  failure: 'c.failure_date',
};

/**
 * The order of a page, written so an index can deliver it. Only the failure date can be empty:
 * undated claims come last newest-first and first oldest-first (the exact reverse), which
 * claims_dealer_failure serves in both directions. The other columns are NOT NULL; a NULLS
 * clause on them would not match their indexes and force a sort of all the dealer's claims.
 */
function orderFor(query: ClaimListQuery) {
  const nulls = query.sort === 'failure' ? { nulls: query.dir === 'desc' ? ('last' as const) : ('first' as const) } : {};
  return [{ column: SORTS[query.sort], order: query.dir, ...nulls }, { column: 'c.id', order: query.dir }];
}

/**
 * One page of the caller's claims, filtered and sorted in SQL. Indexes that serve the dealer
 * list (tests/bench/claims-list.ts prints the plans): claims_dealer_updated (dealer_id,
 * updated_at DESC, id DESC) for the default order, with or without a stage filter;
 * claims_dealer_stage_updated (dealer_id, stage, updated_at DESC, id DESC) for the count and
 * a single rare stage; claims_dealer_number and claims_dealer_failure for the other sorts.
 */
export async function listClaims(user: AppUser, query: ClaimListQuery): Promise<{ rows: ClaimListRow[] } & PageTotal> {
  const filtered = scopeClaims(db()('claims as c'), user);
  if (query.stage) filtered.whereIn('c.stage', query.stage.split(','));
  if (query.brand) filtered.where('c.brand_id', query.brand);
  if (query.q) {
    const like = `%${query.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`;
    filtered.where((w) =>
      w.whereILike('c.number', like).orWhereILike('c.frame_serial', like).orWhereILike('c.customer_name', like).orWhereILike('c.rma_number', like),
    );
  }
  const [counted, rows] = await Promise.all([
    cappedCount(filtered),
    filtered
      .clone()
      .join('organisations as b', 'b.id', 'c.brand_id')
      .join('organisations as d', 'd.id', 'c.dealer_id')
      .leftJoin('bike_models as m', 'm.id', 'c.model_id')
      .leftJoin('parts as p', 'p.id', 'c.part_id')
      .select(
        'c.id', 'c.number', 'c.stage', 'c.replacement_step as replacementStep', 'c.core_step as coreStep', 'b.name as brandName',
        'd.name as dealerName', 'm.name as modelName', 'c.frame_serial as frameSerial', 'p.part_number as partNumber',
        'c.part_category as partCategory', 'c.customer_name as customerName', 'c.rma_number as rmaNumber', 'c.failure_date as failureDate',
        'c.created_at as createdAt', 'c.updated_at as updatedAt',
      )
      .orderBy(orderFor(query))
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
  ]);
  return {
    ...counted,
    rows: rows.map((r) => ({ ...r, createdAt: new Date(r.createdAt).toISOString(), updatedAt: new Date(r.updatedAt).toISOString() })),
  };
}

export async function hasAnyClaim(user: AppUser): Promise<boolean> {
  return !!(await scopeClaims(db()('claims as c'), user).first('c.id'));
}
