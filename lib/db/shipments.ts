import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { TrackingEvent } from '@/lib/carrier/client';
import type { TrackingStatus } from '@/lib/carrier/carriers';
import { scopeClaims } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import type { StoredBatteryClass } from '@/lib/fulfilment/dangerous-goods';
import type { TransportService } from '@/lib/shipping';

export type Direction = 'outbound' | 'return';

export type ShipmentLine = { lineId: string; partId: string; partNumber: string; name: string; quantity: number };

export type Shipment = {
  id: string;
  claimId: string;
  brandId: string;
  direction: Direction;
  carrier: string;
  service: string;
  transport: TransportService;
  trackingNumber: string;
  carrierShipmentId: string | null;
  labelKey: string | null;
  trackingStatus: TrackingStatus;
  lines: ShipmentLine[];
  dangerousGoods: StoredBatteryClass[] | null;
  batteryCondition: 'sound' | 'damaged_or_defective' | null;
  packagingConfirmedBy: string | null;
  packagingConfirmedAt: Date | null;
  handedOverAt: Date | null;
  deliveredAt: Date | null;
  coreDueOn: string | null;
  lastPolledAt: Date | null;
  voidedAt: Date | null;
  createdBy: string | null;
  createdAt: Date;
};

export type ShipmentEvent = { id: number; shipmentId: string; status: TrackingStatus; description: string; location: string; occurredAt: Date };

const columns = [
  's.id', 's.claim_id as claimId', 's.brand_id as brandId', 's.direction', 's.carrier', 's.service', 's.transport',
  's.tracking_number as trackingNumber', 's.carrier_shipment_id as carrierShipmentId', 's.label_key as labelKey',
  's.tracking_status as trackingStatus', 's.lines', 's.dangerous_goods as dangerousGoods', 's.battery_condition as batteryCondition',
  's.packaging_confirmed_by as packagingConfirmedBy', 's.packaging_confirmed_at as packagingConfirmedAt', 's.handed_over_at as handedOverAt',
  's.delivered_at as deliveredAt', 's.core_due_on as coreDueOn', 's.last_polled_at as lastPolledAt', 's.voided_at as voidedAt',
  's.created_by as createdBy', 's.created_at as createdAt',
];

export type NewShipment = {
  claimId: string;
  brandId: string;
  direction: Direction;
  carrier: string;
  service: string;
  transport: TransportService;
  trackingNumber: string;
  carrierShipmentId: string | null;
  labelKey: string | null;
  lines: ShipmentLine[];
  dangerousGoods: StoredBatteryClass[] | null;
  batteryCondition: 'sound' | 'damaged_or_defective' | null;
  packagingConfirmedBy: string | null;
  handedOverAt: 'now' | null;
  createdBy: string;
};

export async function insertShipment(trx: Knex, s: NewShipment): Promise<string> {
  const [row] = await trx('shipments')
    .insert({
      claim_id: s.claimId, brand_id: s.brandId, direction: s.direction, carrier: s.carrier, service: s.service, transport: s.transport,
      tracking_number: s.trackingNumber, carrier_shipment_id: s.carrierShipmentId, label_key: s.labelKey, lines: JSON.stringify(s.lines),
      dangerous_goods: s.dangerousGoods ? JSON.stringify(s.dangerousGoods) : null, battery_condition: s.batteryCondition,
      packaging_confirmed_by: s.packagingConfirmedBy, packaging_confirmed_at: s.packagingConfirmedBy ? trx.fn.now() : null,
      handed_over_at: s.handedOverAt === 'now' ? trx.fn.now() : null, created_by: s.createdBy,
    })
    .returning('id');
  return row.id;
}

/** The claim's live parcel in one direction (a voided label does not count). */
export async function liveShipment(claimId: string, direction: Direction, q: Knex = db()): Promise<Shipment | null> {
  return (await q('shipments as s').select(columns).where({ 's.claim_id': claimId, 's.direction': direction }).whereNull('s.voided_at').first()) ?? null;
}

export async function liveShipments(claimId: string, q: Knex = db()): Promise<Shipment[]> {
  return q('shipments as s').select(columns).where('s.claim_id', claimId).whereNull('s.voided_at').orderBy('s.created_at');
}

/** Whether a carrier booking is on a live parcel of the claim (a repeated request may have recorded it). */
export async function isBookingRecorded(claimId: string, carrierShipmentId: string): Promise<boolean> {
  return !!(await db()('shipments').where({ claim_id: claimId, carrier_shipment_id: carrierShipmentId }).whereNull('voided_at').first('id'));
}

export async function voidShipment(trx: Knex, id: string): Promise<void> {
  await trx('shipments').where({ id }).whereNull('voided_at').update({ voided_at: trx.fn.now(), updated_at: trx.fn.now() });
}

/** A parcel only for a party of its claim; anyone else gets nothing (404). */
export async function findShipmentForUser(user: AppUser, id: string): Promise<Shipment | null> {
  const q = db()('shipments as s').join('claims as c', 'c.id', 's.claim_id').select(columns).where('s.id', id);
  return (await scopeClaims(q, user).first()) ?? null;
}

/** The dealer's core is on its way: the return parcel carries the number the dealer gave. */
export async function markReturnHandedOver(trx: Knex, id: string, tracking: { carrier: string; trackingNumber: string }): Promise<void> {
  await trx('shipments').where({ id }).update({
    carrier: tracking.carrier, tracking_number: tracking.trackingNumber, handed_over_at: trx.fn.now(), updated_at: trx.fn.now(),
  });
}

export async function markReturnReceived(trx: Knex, claimId: string): Promise<void> {
  await trx('shipments')
    .where({ claim_id: claimId, direction: 'return' })
    .whereNull('voided_at')
    .update({ delivered_at: trx.raw('coalesce(delivered_at, now())'), updated_at: trx.fn.now() });
}

/** Parcels the poller asks the carrier about: handed over, not delivered, least recently asked first. */
export async function shipmentsToPoll(limit: number): Promise<Shipment[]> {
  return db()('shipments as s')
    .select(columns)
    .whereNull('s.voided_at')
    .whereNull('s.delivered_at')
    .whereNotNull('s.handed_over_at')
    .orderByRaw('s.last_polled_at NULLS FIRST')
    .limit(limit);
}

/** Stores what the carrier reported: new events (duplicates ignored) and the latest status. */
export async function recordTracking(trx: Knex, id: string, status: TrackingStatus, events: TrackingEvent[], deliveredAt: string | null): Promise<number> {
  let added = 0;
  for (const e of events) {
    const rows = await trx('shipment_events')
      .insert({ shipment_id: id, status: e.status, description: e.description, location: e.location ?? '', occurred_at: e.at })
      .onConflict(['shipment_id', 'status', 'occurred_at'])
      .ignore()
      .returning('id');
    added += rows.length;
  }
  await trx('shipments')
    .where({ id })
    .update({ tracking_status: status, last_polled_at: trx.fn.now(), updated_at: trx.fn.now(), ...(deliveredAt ? { delivered_at: deliveredAt } : {}) });
  return added;
}

export async function touchPolled(id: string): Promise<void> {
  await db()('shipments').where({ id }).update({ last_polled_at: db().fn.now() });
}

export async function setCoreDueOn(trx: Knex, id: string, dueOn: string): Promise<void> {
  await trx('shipments').where({ id }).update({ core_due_on: dueOn, updated_at: trx.fn.now() });
}

/** With no replacement parcel, the due day is kept on the claim itself. */
export async function setClaimCoreDueOn(trx: Knex, claimId: string, dueOn: string): Promise<void> {
  await trx('claims').where({ id: claimId }).update({ core_due_on: dueOn });
}

export async function shipmentEvents(shipmentIds: string[]): Promise<ShipmentEvent[]> {
  if (!shipmentIds.length) return [];
  const rows = await db()('shipment_events')
    .select('id', 'shipment_id as shipmentId', 'status', 'description', 'location', 'occurred_at as occurredAt')
    .whereIn('shipment_id', shipmentIds)
    .orderBy('occurred_at')
    .orderBy('id');
  return rows.map((r) => ({ ...r, id: Number(r.id) }));
}

/**
 * Claims whose core is still expected, with the moment its return clock started: the replacement's
 * delivery, or the approval when the dealer fitted its own stock and nothing shipped. The clock job's list.
 */
export async function coresAwaitingReturn(limit = 500): Promise<{ claimId: string; shipmentId: string | null; deliveredAt: Date; coreDueOn: string | null }[]> {
  const delivered = db()('shipments as s')
    .join('claims as c', 'c.id', 's.claim_id')
    .select('c.id as claimId', 's.id as shipmentId', 's.delivered_at as deliveredAt', 's.core_due_on as coreDueOn')
    .where({ 's.direction': 'outbound', 'c.stage': 'approved', 'c.core_step': 'requested' })
    .whereNull('s.voided_at')
    .whereNotNull('s.delivered_at');
  const fromShopStock = db()('claims as c')
    .select('c.id as claimId', db().raw('NULL::uuid as "shipmentId"'), db().raw(`(c.context #>> '{decision,at}')::timestamptz as "deliveredAt"`), 'c.core_due_on as coreDueOn')
    .where({ 'c.stage': 'approved', 'c.core_step': 'requested' })
    .whereRaw(`c.context #>> '{replacement,fromShopStock}' = 'true'`);
  return db().select('*').from(delivered.unionAll(fromShopStock, true).as('cores')).orderBy('deliveredAt').limit(limit);
}
