import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { ClaimLines } from '@/lib/credits/from-claim';

export type LiabilityEntry = {
  id: number;
  entryDate: string;
  kind: 'opening_balance' | 'accrual' | 'change_in_estimate';
  amountMinor: number;
  currency: string;
  note: string;
  enteredByName: string;
  createdAt: string;
};

export async function liabilityEntries(brandId: string, q: Knex = db()): Promise<LiabilityEntry[]> {
  const rows = await q('liability_entries as e')
    .join('users as u', 'u.id', 'e.entered_by')
    .select('e.id', 'e.entry_date as entryDate', 'e.kind', 'e.amount_minor as amountMinor', 'e.currency', 'e.note', 'u.name as enteredByName', 'e.created_at as createdAt')
    .where('e.brand_id', brandId)
    .orderBy([{ column: 'e.entry_date' }, { column: 'e.id' }]);
  return rows.map((r) => ({ ...r, createdAt: new Date(r.createdAt).toISOString() }));
}

/** Records the entry once per client key: a repeated key returns the entry already made, `replayed`. */
export async function insertLiabilityEntry(
  e: { brandId: string; entryDate: string; kind: LiabilityEntry['kind']; amountMinor: number; currency: string; note: string; by: string; clientKey?: string },
  q: Knex = db(),
): Promise<{ id: number; replayed: boolean; stored: { entryDate: string; kind: string; amountMinor: number; note: string } }> {
  const [row] = await q('liability_entries')
    .insert({
      brand_id: e.brandId, entry_date: e.entryDate, kind: e.kind, amount_minor: e.amountMinor, currency: e.currency, note: e.note, entered_by: e.by,
      client_key: e.clientKey ?? null,
    })
    .onConflict(['brand_id', 'client_key'])
    .ignore()
    .returning('id');
  const stored = { entryDate: e.entryDate, kind: e.kind, amountMinor: e.amountMinor, note: e.note };
  if (row) return { id: row.id, replayed: false, stored };
  const existing = await q('liability_entries').where({ brand_id: e.brandId, client_key: e.clientKey ?? null }).first('id', 'entry_date', 'kind', 'amount_minor', 'note');
  return {
    id: existing.id, replayed: true,
    stored: { entryDate: String(existing.entry_date).slice(0, 10), kind: existing.kind, amountMinor: Number(existing.amount_minor), note: existing.note },
  };
}

export type ShippedClaim = {
  claimId: string;
  rmaNumber: string | null;
  shippedAt: string;
  requestedLines: ClaimLines;
  approvedLines: ClaimLines | null;
  approvalFlags: { lineId: string; approved: boolean }[];
  partNumber: string | null;
  partCategory: string | null;
};

/**
 * Claims whose replacement left the brand's warehouse, read from the lifecycle record until
 * shipments are kept in their own table.
 */
export async function shippedClaims(brandId: string, q: Knex = db()): Promise<ShippedClaim[]> {
  const rows = await q('claims as c')
    .leftJoin('parts as p', 'p.id', 'c.part_id')
    .select(
      'c.id as claimId', 'c.rma_number as rmaNumber', q.raw(`c.context #>> '{replacement,shippedAt}' as "shippedAt"`),
      'c.requested_lines as requestedLines', 'c.approved_lines as approvedLines', q.raw(`c.context -> 'approvedLines' as "approvalFlags"`),
      'p.part_number as partNumber', 'c.part_category as partCategory',
    )
    .where('c.brand_id', brandId)
    .whereRaw(`c.context #>> '{replacement,shippedAt}' IS NOT NULL`);
  return rows;
}

/** What each part costs the brand, and its category. */
export async function partCosts(brandId: string, q: Knex = db()): Promise<Map<string, { unitCostMinor: number | null; category: string }>> {
  const rows = await q('parts').select('part_number', 'unit_cost_minor', 'category').where({ brand_id: brandId });
  return new Map(rows.map((r) => [r.part_number, { unitCostMinor: r.unit_cost_minor, category: r.category }]));
}

/** The failed part of each claim, which labor and freight lines are attributed to. */
export async function claimParts(claimIds: readonly string[], q: Knex = db()): Promise<Map<string, { partNumber: string; category: string }>> {
  if (claimIds.length === 0) return new Map();
  const rows = await q('claims as c')
    .leftJoin('parts as p', 'p.id', 'c.part_id')
    .select('c.id', 'p.part_number', 'c.part_category')
    .whereIn('c.id', claimIds);
  return new Map(rows.map((r) => [r.id, { partNumber: r.part_number ?? 'no part', category: r.part_category ?? 'other' }]));
}

export async function brandSettings(brandId: string, q: Knex = db()): Promise<{ currency: string; timeZone: string; name: string }> {
  return q('organisations').where({ id: brandId, kind: 'brand' }).first('currency', 'time_zone as timeZone', 'name');
}
