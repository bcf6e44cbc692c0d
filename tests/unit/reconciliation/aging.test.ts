import { describe, expect, it } from 'vitest';
import { addDays } from '@/lib/calendar';
import { ageOpenItems, agingBucket } from '@/lib/reconciliation';

// Bucket edges as the product brief states them: 0–30, 31–60, 61–90, 90+ (over 90) days.
const asOf = '2025-06-30';
const item = (id: string, age: number, amountMinor: number, dealerId = 'D-NORTH') => ({
  id,
  dealerId,
  currency: 'USD' as const,
  amountMinor,
  issuedOn: addDays(asOf, -age),
});

describe('aging of open credits and chargebacks', () => {
  it.each([
    [0, 'days_0_30'],
    [30, 'days_0_30'],
    [31, 'days_31_60'],
    [60, 'days_31_60'],
    [61, 'days_61_90'],
    [90, 'days_61_90'],
    [91, 'days_over_90'],
    [400, 'days_over_90'],
  ] as const)('%i days old → %s', (age, bucket) => {
    expect(agingBucket(age)).toBe(bucket);
    const report = ageOpenItems([item('x', age, 100)], asOf);
    expect(report.rows[0]?.credits.amounts[bucket]).toBe(100);
    expect(report.rows[0]?.credits.count).toBe(1);
  });

  it('counts the age in calendar days across month ends (2025-05-31 → 2025-06-30 is 30 days)', () => {
    const r = ageOpenItems([{ id: 'a', dealerId: 'D', currency: 'USD', amountMinor: 5, issuedOn: '2025-05-31' }], asOf);
    expect(r.rows[0]?.credits.amounts.days_0_30).toBe(5);
    const s = ageOpenItems([{ id: 'a', dealerId: 'D', currency: 'USD', amountMinor: 5, issuedOn: '2025-05-30' }], asOf);
    expect(s.rows[0]?.credits.amounts.days_31_60).toBe(5);
  });

  it('totals exactly per dealer, credits and chargebacks apart, with the net', () => {
    const r = ageOpenItems(
      [
        item('a', 10, 16753),
        item('b', 29, 12000),
        item('c', 45, -38900),
        item('d', 95, 1),
        item('e', 95, 2),
        item('f', 5, 999, 'D-SOUTH'),
        item('z', 5, 0),
      ],
      asOf,
    );
    const north = r.rows.find((x) => x.dealerId === 'D-NORTH');
    expect(north?.credits.amounts).toEqual({ days_0_30: 28753, days_31_60: 0, days_61_90: 0, days_over_90: 3 });
    expect(north?.chargebacks.amounts).toEqual({ days_0_30: 0, days_31_60: -38900, days_61_90: 0, days_over_90: 0 });
    expect(north?.net.totalMinor).toBe(28753 + 3 - 38900);
    expect(north?.net.count).toBe(5); // the zero item is nothing open
    expect(r.rows.map((x) => x.dealerId)).toEqual(['D-NORTH', 'D-SOUTH']);
    expect(r.totals).toHaveLength(1);
    expect(r.totals[0]?.credits.totalMinor).toBe(28753 + 3 + 999);
  });

  it('keeps currencies apart and refuses an item issued after the as-of date', () => {
    const r = ageOpenItems([item('a', 1, 100), { ...item('b', 1, 100), currency: 'EUR' }], asOf);
    expect(r.rows.map((x) => x.currency)).toEqual(['EUR', 'USD']);
    expect(() => ageOpenItems([item('late', -1, 100)], asOf)).toThrow(/open item late: issued on 2025-07-01, after the as-of date 2025-06-30/);
    expect(() => ageOpenItems([], '30.06.2025')).toThrow(/asOf/);
  });
});
