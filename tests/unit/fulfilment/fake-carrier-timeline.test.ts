import { describe, expect, it } from 'vitest';
import { trackingOf, type FakeShipment } from '@/scripts/fakes/carrier';

// The local fake carrier's clock (documented in lib/carrier/README.md): fixed steps in carrier
// hours after booking, `speed` carrier hours per real hour; a drop-off waits a day for the sender.
const base: FakeShipment = {
  id: 'shp_1', carrier: 'ferrule', service: 'road', trackingNumber: 'FP4821397608', reference: 'RMA-X',
  shipFrom: { name: 'W', line: 'L', city: 'Zwolle', postcode: '1', country: 'NL' },
  shipTo: { name: 'Shop', line: 'L', city: 'Freiburg', postcode: '2', country: 'DE' },
  parcels: [], dangerousGoods: [], handover: 'collection', hasLabel: true, idempotencyKey: null,
  createdAt: '2026-12-01T08:00:00.000Z', cancelledAt: null, forced: {},
};
const t0 = Date.parse(base.createdAt);
const minutes = (m: number) => t0 + m * 60_000;

describe('fake carrier timeline', () => {
  it('ground, collected: picked up at 2 h, in transit at 5 h, out for delivery at 20 h, delivered at 24 h (speed 60: minutes)', () => {
    expect(trackingOf(base, minutes(1), 60).status).toBe('label_created');
    expect(trackingOf(base, minutes(2), 60).status).toBe('picked_up');
    expect(trackingOf(base, minutes(5), 60).status).toBe('in_transit');
    expect(trackingOf(base, minutes(23), 60).status).toBe('out_for_delivery');
    const done = trackingOf(base, minutes(24), 60);
    expect(done.status).toBe('delivered');
    expect(done.events.map((e) => e.status)).toEqual(['label_created', 'picked_up', 'in_transit', 'out_for_delivery', 'delivered']);
    expect(done.events.at(-1)).toMatchObject({ location: 'Freiburg', description: 'Delivered to Shop' });
  });

  it('a drop-off return label waits a day for the sender; at speed 1 nothing moves for real hours', () => {
    expect(trackingOf({ ...base, handover: 'drop_off' }, minutes(24), 60).status).toBe('label_created');
    expect(trackingOf({ ...base, handover: 'drop_off' }, minutes(26), 60).status).toBe('picked_up');
    expect(trackingOf(base, minutes(60), 1).status).toBe('label_created');
  });

  it('forced steps happen when they were forced and stay there', () => {
    const forced = { ...base, forced: { picked_up: '2026-12-01T08:00:30.000Z', in_transit: '2026-12-01T08:00:30.000Z' } };
    const r = trackingOf(forced, minutes(1), 60);
    expect(r.status).toBe('in_transit');
    expect(r.events.find((e) => e.status === 'in_transit')!.at).toBe('2026-12-01T08:00:30.000Z');
  });
});
