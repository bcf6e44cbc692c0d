import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { ferruleNumber } from '@/lib/carrier/carriers';
import { classifyPart, storedClass } from '@/lib/fulfilment/dangerous-goods';
import type { ClaimLines } from '@/lib/credits/from-claim';

// The parcel rows behind a driven claim's SHIP and CORE_SHIPPED steps, as the warehouse and the
// dealer would have left them: Ferrule Parcel by road, handed over, delivered, with the tracking
// events and the delivery entry on the claim's log that the poller would have stored and the lithium classification for a battery. Delivered
// parcels are never polled again, so the fake carrier need not know these numbers.

export type DemoParcel = {
  direction: 'outbound' | 'return';
  handedOverAt: string;
  deliveredAt: string;
  createdBy: string;
};

export const DEMO_CARRIER = 'ferrule';
const SERVICE = 'road';

/** A tracking number of the carrier's format, the same for a claim and direction on every load. */
export function demoTrackingNumber(claimId: string, direction: 'outbound' | 'return'): string {
  const digits = parseInt(createHash('sha256').update(`${claimId}:${direction}`).digest('hex').slice(0, 12), 16) % 100_000_000;
  // 9xx… serials: the fake carrier counts its own from 1, so the two never meet.
  return ferruleNumber(900_000_000 + digits);
}

const later = (iso: string, hours: number) => new Date(Date.parse(iso) + hours * 3_600_000).toISOString();

export async function insertDemoParcel(knex: Knex, claimId: string, p: DemoParcel): Promise<string> {
  const claim = await knex('claims').where({ id: claimId }).first('brand_id', 'part_id', 'approved_lines', 'requested_lines', 'state_value');
  // Stored lines carry the catalog id of each part beside its number.
  const lines = (claim.approved_lines ?? claim.requested_lines) as { parts: (ClaimLines['parts'][number] & { partId: string })[] };
  const picked =
    p.direction === 'outbound'
      ? lines.parts.filter((l) => !l.fromDealerStock && l.quantity > 0).map((l) => ({ partId: l.partId, lineId: l.lineId, quantity: l.quantity }))
      : [{ partId: claim.part_id as string, lineId: 'core', quantity: 1 }];
  const parts = await knex('parts').whereIn('id', picked.map((l) => l.partId)).select('id', 'part_number', 'name', 'category', 'rated_capacity_ah', 'nominal_voltage_v');
  const byId = new Map(parts.map((x) => [x.id, x]));
  const shipmentLines = picked.map((l) => {
    const part = byId.get(l.partId)!;
    return { lineId: l.lineId, partId: l.partId, partNumber: part.part_number, name: part.name, quantity: l.quantity };
  });
  const dangerousGoods = picked.flatMap((l) => {
    const part = byId.get(l.partId)!;
    const spec = { partNumber: part.part_number, category: part.category, ratedCapacityAh: part.rated_capacity_ah === null ? null : Number(part.rated_capacity_ah), nominalVoltageV: part.nominal_voltage_v === null ? null : Number(part.nominal_voltage_v) };
    const c = classifyPart(spec, { direction: p.direction, condition: 'sound', transport: 'ground' });
    return c ? [storedClass(part.part_number, l.quantity, c)] : [];
  });
  const trackingNumber = demoTrackingNumber(claimId, p.direction);
  const [row] = await knex('shipments')
    .insert({
      claim_id: claimId, brand_id: claim.brand_id, direction: p.direction, carrier: DEMO_CARRIER, service: SERVICE, transport: 'ground',
      tracking_number: trackingNumber, lines: JSON.stringify(shipmentLines), dangerous_goods: dangerousGoods.length ? JSON.stringify(dangerousGoods) : null,
      battery_condition: dangerousGoods.length ? 'sound' : null, tracking_status: 'delivered', handed_over_at: p.handedOverAt,
      delivered_at: p.deliveredAt, last_polled_at: p.deliveredAt, created_by: p.createdBy, created_at: p.handedOverAt, updated_at: p.deliveredAt,
    })
    .returning('id');
  const events = [
    { status: 'picked_up', description: 'Collected from the sender', at: p.handedOverAt },
    { status: 'in_transit', description: 'At the sorting hub', at: later(p.handedOverAt, 10) },
    { status: 'out_for_delivery', description: 'With the driver for delivery', at: later(p.deliveredAt, -4) },
    { status: 'delivered', description: 'Delivered, signed for at reception', at: p.deliveredAt },
  ];
  await knex('shipment_events').insert(events.map((e) => ({ shipment_id: row.id, status: e.status, description: e.description, location: '', occurred_at: e.at, recorded_at: e.at })));
  const state = JSON.stringify(claim.state_value);
  await knex('claim_events').insert({
    claim_id: claimId, actor_id: null, actor_role: 'system', event: p.direction === 'outbound' ? 'REPLACEMENT_DELIVERED' : 'CORE_PARCEL_DELIVERED',
    from_state: state, to_state: state, created_at: p.deliveredAt,
    payload: JSON.stringify({ carrier: DEMO_CARRIER, trackingNumber, deliveredAt: p.deliveredAt, location: '' }),
  });
  return trackingNumber;
}
