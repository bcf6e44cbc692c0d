import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { StockLevel } from '@/lib/fulfilment/stock';

export type StockRow = {
  partId: string;
  partNumber: string;
  name: string;
  category: string;
  onHand: number;
  restockExpectedOn: string | null;
  /** Quantity on approved claims still waiting to ship. */
  waiting: number;
  updatedAt: Date | null;
};

export type StockMovement = {
  id: number;
  partId: string;
  partNumber: string;
  kind: 'shipment' | 'adjustment' | 'expected_date';
  delta: number;
  onHandAfter: number;
  reason: string;
  note: string;
  expectedOn: string | null;
  claimId: string | null;
  claimNumber: string | null;
  userName: string | null;
  createdAt: Date;
};

/** Parts' stock for one brand; a part with no row has none on hand. */
export async function stockLevelsFor(brandId: string, partIds: string[], q: Knex = db()): Promise<Map<string, StockLevel>> {
  if (!partIds.length) return new Map();
  const rows = await q('stock_levels')
    .select('part_id as partId', 'on_hand as onHand', 'restock_expected_on as restockExpectedOn')
    .where({ brand_id: brandId })
    .whereIn('part_id', partIds);
  return new Map(rows.map((r) => [r.partId as string, { onHand: Number(r.onHand), restockExpectedOn: r.restockExpectedOn }]));
}

/** The brand's parts with what is on the shelf and what approved claims are waiting for. */
export async function listStock(brandId: string): Promise<StockRow[]> {
  const waiting = db()
    .from(db().raw(`claims c, jsonb_array_elements(coalesce(c.approved_lines -> 'parts', '[]'::jsonb)) AS line`))
    .where('c.brand_id', brandId)
    .where('c.stage', 'approved')
    .where('c.replacement_step', 'to_ship')
    .whereRaw(`coalesce((line ->> 'fromDealerStock')::boolean, false) = false`)
    .groupByRaw(`line ->> 'partId'`)
    .select(db().raw(`(line ->> 'partId')::uuid AS part_id`), db().raw(`sum((line ->> 'quantity')::int)::int AS waiting`))
    .as('w');
  const rows = await db()('parts as p')
    .leftJoin('stock_levels as s', 's.part_id', 'p.id')
    .leftJoin(waiting, 'w.part_id', 'p.id')
    .select(
      'p.id as partId', 'p.part_number as partNumber', 'p.name', 'p.category', db().raw('coalesce(s.on_hand, 0) as "onHand"'),
      's.restock_expected_on as restockExpectedOn', db().raw('coalesce(w.waiting, 0) as waiting'), 's.updated_at as updatedAt',
    )
    .where('p.brand_id', brandId)
    .orderBy('p.part_number');
  return rows.map((r) => ({ ...r, onHand: Number(r.onHand), waiting: Number(r.waiting) }));
}

export async function findStockPart(brandId: string, partId: string, q: Knex = db()) {
  return (
    (await q('parts as p')
      .leftJoin('stock_levels as s', 's.part_id', 'p.id')
      .select('p.id as partId', 'p.part_number as partNumber', 'p.name', db().raw('coalesce(s.on_hand, 0) as "onHand"'), 's.restock_expected_on as restockExpectedOn')
      .where({ 'p.brand_id': brandId, 'p.id': partId })
      .first()) ?? null
  );
}

async function ensureRow(trx: Knex, brandId: string, partId: string): Promise<void> {
  await trx('stock_levels').insert({ brand_id: brandId, part_id: partId, on_hand: 0 }).onConflict('part_id').ignore();
}

/**
 * Takes stock for a shipment. Guarded: the row changes only when enough is on hand, so two
 * shipments racing for the last part cannot both take it. Returns the level after, or null (short).
 */
export async function takeStock(trx: Knex, m: { brandId: string; partId: string; quantity: number; claimId: string; userId: string; reason: string }): Promise<number | null> {
  const rows = await trx('stock_levels')
    .where({ brand_id: m.brandId, part_id: m.partId })
    .where('on_hand', '>=', m.quantity)
    .update({ on_hand: trx.raw('on_hand - ?', [m.quantity]), updated_at: trx.fn.now() })
    .returning('on_hand');
  const after = rows[0]?.on_hand;
  if (after === undefined) return null;
  await trx('stock_movements').insert({
    brand_id: m.brandId, part_id: m.partId, kind: 'shipment', delta: -m.quantity, on_hand_after: after, reason: m.reason,
    claim_id: m.claimId, user_id: m.userId,
  });
  return Number(after);
}

/** An adjustment with a reason; refused (null) when it would take the level below zero. */
export async function adjustStock(
  trx: Knex,
  m: { brandId: string; partId: string; delta: number; reason: string; note: string; userId: string; expectedOnHand?: number },
): Promise<number | null> {
  await ensureRow(trx, m.brandId, m.partId);
  const q = trx('stock_levels')
    .where({ brand_id: m.brandId, part_id: m.partId })
    .whereRaw('on_hand + ? >= 0', [m.delta]);
  if (m.expectedOnHand !== undefined) q.where('on_hand', m.expectedOnHand);
  const rows = await q
    .update({ on_hand: trx.raw('on_hand + ?', [m.delta]), updated_at: trx.fn.now() })
    .returning('on_hand');
  const after = rows[0]?.on_hand;
  if (after === undefined) return null;
  await trx('stock_movements').insert({
    brand_id: m.brandId, part_id: m.partId, kind: 'adjustment', delta: m.delta, on_hand_after: after, reason: m.reason, note: m.note, user_id: m.userId,
  });
  return Number(after);
}

export async function setRestockDate(trx: Knex, m: { brandId: string; partId: string; expectedOn: string | null; note: string; userId: string }): Promise<void> {
  await ensureRow(trx, m.brandId, m.partId);
  const [row] = await trx('stock_levels')
    .where({ brand_id: m.brandId, part_id: m.partId })
    .update({ restock_expected_on: m.expectedOn, updated_at: trx.fn.now() })
    .returning('on_hand');
  await trx('stock_movements').insert({
    brand_id: m.brandId, part_id: m.partId, kind: 'expected_date', delta: 0, on_hand_after: row.on_hand, reason: m.expectedOn ? 'restock_expected' : 'restock_date_cleared',
    note: m.note, expected_on: m.expectedOn, user_id: m.userId,
  });
}

export async function listMovements(brandId: string, opts: { partId?: string; limit?: number } = {}): Promise<StockMovement[]> {
  const q = db()('stock_movements as m')
    .join('parts as p', 'p.id', 'm.part_id')
    .leftJoin('claims as c', 'c.id', 'm.claim_id')
    .leftJoin('users as u', 'u.id', 'm.user_id')
    .select(
      'm.id', 'm.part_id as partId', 'p.part_number as partNumber', 'm.kind', 'm.delta', 'm.on_hand_after as onHandAfter', 'm.reason', 'm.note',
      'm.expected_on as expectedOn', 'm.claim_id as claimId', 'c.number as claimNumber', 'u.name as userName', 'm.created_at as createdAt',
    )
    .where('m.brand_id', brandId)
    .orderBy('m.id', 'desc')
    .limit(opts.limit ?? 50);
  if (opts.partId) q.where('m.part_id', opts.partId);
  return (await q).map((r) => ({ ...r, id: Number(r.id) }));
}
