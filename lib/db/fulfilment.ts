import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { AppUser } from '@/lib/db/users';
import type { ReturnsQuery, ToShipQuery } from '@/lib/validation/fulfilment';

export type OrgAddress = { id: string; name: string; line: string; city: string; postcode: string; country: string; timeZone: string; contactEmail: string | null };

export async function organisationAddress(id: string, q: Knex = db()): Promise<OrgAddress | null> {
  return (
    (await q('organisations')
      .select('id', 'name', 'address_line as line', 'city', 'postcode', 'country', 'time_zone as timeZone', 'contact_email as contactEmail')
      .where({ id })
      .first()) ?? null
  );
}

const like = (s: string) => `%${s.replace(/[%_\\]/g, (m) => `\\${m}`)}%`;

// A line is short when the shelf holds less than the line needs (lines from the dealer's own stock never are).
const SHORT_LINE = `EXISTS (
  SELECT 1 FROM jsonb_array_elements(coalesce(c.approved_lines -> 'parts', '[]'::jsonb)) AS l
  LEFT JOIN stock_levels sl ON sl.part_id = (l ->> 'partId')::uuid
  WHERE coalesce((l ->> 'fromDealerStock')::boolean, false) = false AND coalesce(sl.on_hand, 0) < (l ->> 'quantity')::int)`;

const HAS_BATTERY = `EXISTS (
  SELECT 1 FROM jsonb_array_elements(coalesce(c.approved_lines -> 'parts', '[]'::jsonb)) AS l
  JOIN parts bp ON bp.id = (l ->> 'partId')::uuid
  WHERE bp.category = 'battery' AND coalesce((l ->> 'fromDealerStock')::boolean, false) = false)`;

export type ToShipRow = {
  id: string;
  number: string;
  rmaNumber: string | null;
  dealerName: string;
  dealerCity: string;
  dealerCountry: string;
  approvedAt: string | null;
  parts: { lineId: string; partId: string; partNumber: string; name: string; quantity: number; fromDealerStock: boolean }[];
  backordered: boolean;
  hasBattery: boolean;
  version: number;
};

/** The to-ship queue: the brand's approved claims whose replacement has not left yet. */
export async function listToShip(user: AppUser, query: ToShipQuery): Promise<{ rows: ToShipRow[]; total: number }> {
  const base = db()('claims as c')
    .join('organisations as d', 'd.id', 'c.dealer_id')
    .where({ 'c.brand_id': user.organisationId, 'c.stage': 'approved', 'c.replacement_step': 'to_ship' });
  if (query.filter === 'ready') base.whereRaw(`NOT ${SHORT_LINE}`);
  if (query.filter === 'backordered') base.whereRaw(SHORT_LINE);
  if (query.filter === 'batteries') base.whereRaw(HAS_BATTERY);
  if (query.q) base.where((w) => w.whereILike('c.rma_number', like(query.q!)).orWhereILike('c.number', like(query.q!)).orWhereILike('d.name', like(query.q!)));
  const order = { approved: db().raw(`(c.context -> 'decision' ->> 'at')`), rma: 'c.rma_number', dealer: 'd.name' }[query.sort];
  const [count, rows] = await Promise.all([
    base.clone().count<{ count: string }[]>('c.id as count').first(),
    base
      .clone()
      .select(
        'c.id', 'c.number', 'c.rma_number as rmaNumber', 'd.name as dealerName', 'd.city as dealerCity', 'd.country as dealerCountry',
        db().raw(`c.context -> 'decision' ->> 'at' AS "approvedAt"`), db().raw(`coalesce(c.approved_lines -> 'parts', '[]'::jsonb) AS parts`),
        db().raw(`${SHORT_LINE} AS backordered`), db().raw(`${HAS_BATTERY} AS "hasBattery"`), 'c.version',
      )
      .orderBy([{ column: order as string, order: query.dir }, { column: 'c.id', order: query.dir }])
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
  ]);
  return { total: Number(count?.count ?? 0), rows: rows as ToShipRow[] };
}

export type ReturnRow = {
  id: string;
  number: string;
  rmaNumber: string | null;
  dealerName: string;
  partNumber: string | null;
  partName: string | null;
  partCategory: string | null;
  coreStep: string;
  labelTracking: string | null;
  labelCarrier: string | null;
  trackingStatus: string | null;
  batteryCondition: string | null;
  coreDueOn: string | null;
  deliveredAt: string | null;
  /** Nothing was shipped (the shop's own part, or none approved): the clock runs from the approval. */
  nothingShips: boolean;
  receivedAt: string | null;
};

/** The returns queue: cores the brand expects back, is receiving, or must inspect. */
export async function listReturns(user: AppUser, query: ReturnsQuery, today: string): Promise<{ rows: ReturnRow[]; total: number }> {
  const base = db()('claims as c')
    .join('organisations as d', 'd.id', 'c.dealer_id')
    .leftJoin('parts as p', 'p.id', 'c.part_id')
    .leftJoin('shipments as r', (j) => j.on('r.claim_id', 'c.id').andOn(db().raw(`r.direction = 'return'`)).andOnNull('r.voided_at'))
    .leftJoin('shipments as o', (j) => j.on('o.claim_id', 'c.id').andOn(db().raw(`o.direction = 'outbound'`)).andOnNull('o.voided_at'))
    .where({ 'c.brand_id': user.organisationId, 'c.stage': 'approved' });
  switch (query.filter) {
    case 'label_needed':
      base.where('c.core_step', 'requested').whereNull('r.id');
      break;
    case 'awaiting_dealer':
      base.where('c.core_step', 'requested').whereNotNull('r.id');
      break;
    case 'in_transit':
    case 'received':
      base.where('c.core_step', query.filter);
      break;
    case 'overdue':
      base.where('c.core_step', 'requested').where(db().raw('coalesce(o.core_due_on, c.core_due_on)'), '<', today);
      break;
    case 'closed':
      base.whereIn('c.core_step', ['inspected', 'waived', 'written_off']);
      break;
    default:
      base.whereIn('c.core_step', ['requested', 'in_transit', 'received']);
  }
  if (query.q) base.where((w) => w.whereILike('c.rma_number', like(query.q!)).orWhereILike('c.number', like(query.q!)).orWhereILike('d.name', like(query.q!)).orWhereILike('r.tracking_number', like(query.q!)));
  // A delivered replacement's due day is on its parcel; with nothing shipped it is on the claim.
  const order = { due: db().raw('coalesce(o.core_due_on, c.core_due_on)'), rma: 'c.rma_number', dealer: 'd.name' }[query.sort];
  const [count, rows] = await Promise.all([
    base.clone().count<{ count: string }[]>('c.id as count').first(),
    base
      .clone()
      .select(
        'c.id', 'c.number', 'c.rma_number as rmaNumber', 'd.name as dealerName', 'p.part_number as partNumber', 'p.name as partName',
        'c.part_category as partCategory', 'c.core_step as coreStep', 'r.tracking_number as labelTracking', 'r.carrier as labelCarrier',
        'r.tracking_status as trackingStatus', 'r.battery_condition as batteryCondition', db().raw('coalesce(o.core_due_on, c.core_due_on) as "coreDueOn"'),
        db().raw(`coalesce((c.context #>> '{replacement,fromShopStock}')::boolean, false) as "nothingShips"`),
        'o.delivered_at as deliveredAt', db().raw(`c.context -> 'core' ->> 'receivedAt' AS "receivedAt"`),
      )
      .orderBy([{ column: order, order: query.dir, nulls: 'last' }, { column: 'c.id', order: query.dir }])
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
  ]);
  return {
    total: Number(count?.count ?? 0),
    rows: (rows as ReturnRow[]).map((r) => ({ ...r, deliveredAt: r.deliveredAt ? new Date(r.deliveredAt).toISOString() : null })),
  };
}

/** A claim of the caller's brand by its RMA number (canonical form); another brand's RMA is not found. */
export async function findClaimIdByRma(user: AppUser, rmaNumber: string): Promise<{ id: string; number: string; stage: string; coreStep: string | null } | null> {
  if (user.orgKind !== 'brand') return null;
  return (
    (await db()('claims')
      .select('id', 'number', 'stage', 'core_step as coreStep')
      .where({ brand_id: user.organisationId, rma_number: rmaNumber })
      .whereNotNull('submitted_at')
      .first()) ?? null
  );
}
