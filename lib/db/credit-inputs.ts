import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { CreditCatalog } from '@/lib/credits/from-claim';
import type { RequestedLines } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import type { ClaimContext } from '@/machines/claim';

/** The brand settings a claim's credit is computed with. */
export type CreditTerms = { brandTimeZone: string; brandMaxRateMinor: number; dealerRateMinor: number };

export async function creditTerms(claim: { brandId: string; dealerAccountId: string }, q: Knex = db()): Promise<CreditTerms> {
  const r = await q('dealer_accounts as a')
    .join('organisations as b', 'b.id', 'a.brand_id')
    .where({ 'a.id': claim.dealerAccountId, 'b.id': claim.brandId })
    .first('b.time_zone as brandTimeZone', 'b.max_labor_rate_minor as brandMaxRateMinor', 'a.labor_rate_minor as dealerRateMinor');
  if (!r) throw new Error('the claim has no dealer account with its brand');
  return r;
}

/**
 * Categories and scheduled hours for the claims' lines, and every price of their parts (all
 * dates: the price in force on the repair date is chosen by the credit rules).
 */
export async function creditCatalog(brandId: string, lines: readonly RequestedLines[], q: Knex = db()): Promise<CreditCatalog> {
  const partNumbers = [...new Set(lines.flatMap((l) => l.parts.map((p) => p.partNumber)))];
  const codes = [...new Set(lines.flatMap((l) => l.labor.map((x) => x.code)))];
  // One after the other: inside a transaction the queries share one connection.
  const parts = partNumbers.length ? await q('parts').select('part_number', 'category').where({ brand_id: brandId }).whereIn('part_number', partNumbers) : [];
  const ops = codes.length ? await q('labor_operations').select('code', 'standard_hours').where({ brand_id: brandId }).whereIn('code', codes) : [];
  const prices = partNumbers.length
    ? await q('price_list as pl')
        .join('parts as p', 'p.id', 'pl.part_id')
        .select('p.part_number as partNumber', 'pl.net_price_minor as dealerNetMinor', 'pl.effective_from as effectiveFrom')
        .where('pl.brand_id', brandId)
        .whereIn('p.part_number', partNumbers)
        .orderBy(['p.part_number', 'pl.effective_from'])
    : [];
  return {
    partCategories: Object.fromEntries(parts.map((p: { part_number: string; category: string }) => [p.part_number, p.category])),
    scheduledHours: Object.fromEntries(ops.map((o: { code: string; standard_hours: string }) => [o.code, String(o.standard_hours)])),
    priceList: prices,
  };
}

export type QueueRow = {
  id: string;
  number: string;
  version: number;
  dealerName: string;
  accountNumber: string;
  partNumber: string | null;
  partName: string | null;
  rmaNumber: string | null;
  currency: string;
  brandId: string;
  dealerAccountId: string;
  requestedLines: RequestedLines;
  approvedLines: RequestedLines | null;
  context: ClaimContext;
  failureDate: string | null;
  waitingSince: string;
};

export type QueueQuery = { page: number; pageSize: number; sort: 'waiting' | 'number' | 'dealer'; dir: 'asc' | 'desc'; q?: string };

const SORTS: Record<QueueQuery['sort'], string> = { waiting: 'c.updated_at', number: 'c.number', dealer: 'd.name' };

/** One page of the brand's claims waiting for their credit (both tracks done). */
export async function listCreditQueue(user: AppUser, query: QueueQuery): Promise<{ rows: QueueRow[]; total: number }> {
  const base = () => {
    const b = db()('claims as c')
      .join('organisations as d', 'd.id', 'c.dealer_id')
      .where({ 'c.brand_id': user.organisationId, 'c.stage': 'credit_pending' });
    if (query.q) {
      const like = `%${query.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`;
      b.where((w) => w.whereILike('c.number', like).orWhereILike('c.rma_number', like).orWhereILike('d.name', like));
    }
    return b;
  };
  const [count, rows] = await Promise.all([
    base().count<{ n: string }[]>('c.id as n').first(),
    base()
      .join('dealer_accounts as a', 'a.id', 'c.dealer_account_id')
      .join('organisations as b', 'b.id', 'c.brand_id')
      .leftJoin('parts as p', 'p.id', 'c.part_id')
      .select(
        'c.id', 'c.number', 'c.version', 'd.name as dealerName', 'a.account_number as accountNumber', 'p.part_number as partNumber',
        'p.name as partName', 'c.rma_number as rmaNumber', 'b.currency', 'c.brand_id as brandId', 'c.dealer_account_id as dealerAccountId',
        'c.requested_lines as requestedLines', 'c.approved_lines as approvedLines', 'c.context', 'c.failure_date as failureDate', 'c.updated_at as waitingSince',
      )
      .orderBy([{ column: SORTS[query.sort], order: query.dir }, { column: 'c.id', order: query.dir }])
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
  ]);
  return {
    total: Number(count?.n ?? 0),
    rows: rows.map((r) => ({ ...r, waitingSince: new Date(r.waitingSince).toISOString() })),
  };
}
