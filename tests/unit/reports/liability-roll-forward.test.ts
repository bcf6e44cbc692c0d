import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { liabilityRollForward, type LiabilityMovement } from '@/lib/reports';

// ASC 460-10-50-8(c): beginning balance − reductions for payments made (in cash or in kind)
// + accruals for warranties issued during the period ± changes in estimate = ending balance.
// The figures are an invented worked example, computed by hand below.
describe('warranty liability roll-forward (ASC 460-10-50-8(c))', () => {
  it('worked example: 120,000.00 − 41,250.00 − 18,400.00 + 52,000.00 − 3,600.00 = 108,750.00', () => {
    const movements: LiabilityMovement[] = [
      { date: '2025-01-14', kind: 'settlement_cash', amountMinor: 2_250_000 },
      { date: '2025-02-11', kind: 'settlement_cash', amountMinor: 2_000_000 },
      { date: '2025-03-03', kind: 'settlement_cash', amountMinor: -125_000, note: 'chargeback recovered' },
      { date: '2025-02-20', kind: 'settlement_in_kind', amountMinor: 1_840_000 },
      { date: '2025-03-31', kind: 'accrual', amountMinor: 5_200_000 },
      { date: '2025-03-31', kind: 'change_in_estimate', amountMinor: -360_000, note: 'expired coverage, lower claim rate' },
    ];
    const r = liabilityRollForward({
      currency: 'USD',
      periodStart: '2025-01-01',
      periodEnd: '2025-03-31',
      beginningBalanceMinor: 12_000_000,
      movements,
    });
    expect(r).toMatchObject({
      settlementsInCashMinor: 4_125_000,
      settlementsInKindMinor: 1_840_000,
      accrualsMinor: 5_200_000,
      changesInEstimateMinor: -360_000,
      endingBalanceMinor: 10_875_000,
    });
    expect(r.lines.map((l) => l.amountMinor)).toEqual([12_000_000, -4_125_000, -1_840_000, 5_200_000, -360_000, 10_875_000]);
    // The presented lines foot to the ending balance.
    expect(r.lines.slice(0, -1).reduce((a, l) => a + l.amountMinor, 0)).toBe(r.endingBalanceMinor);
  });

  it('the identity holds exactly for any movements (BigInt recomputation)', () => {
    const kinds = ['settlement_cash', 'settlement_in_kind', 'accrual', 'change_in_estimate'] as const;
    fc.assert(
      fc.property(
        fc.integer({ min: -(10 ** 12), max: 10 ** 12 }),
        fc.array(fc.record({ kind: fc.constantFrom(...kinds), amount: fc.integer({ min: 0, max: 10 ** 11 }), negative: fc.boolean(), day: fc.integer({ min: 1, max: 28 }) })),
        (beginning, ms) => {
          const movements = ms.map((m) => ({
            date: `2025-02-${String(m.day).padStart(2, '0')}`,
            kind: m.kind,
            amountMinor: m.negative && (m.kind === 'settlement_cash' || m.kind === 'change_in_estimate') ? -m.amount : m.amount,
          }));
          const r = liabilityRollForward({ currency: 'EUR', periodStart: '2025-02-01', periodEnd: '2025-02-28', beginningBalanceMinor: beginning, movements });
          const sum = (k: string) => movements.filter((m) => m.kind === k).reduce((a, m) => a + BigInt(m.amountMinor), 0n);
          const expected = BigInt(beginning) - sum('settlement_cash') - sum('settlement_in_kind') + sum('accrual') + sum('change_in_estimate');
          expect(BigInt(r.endingBalanceMinor)).toBe(expected);
        },
      ),
    );
  });

  it('refuses movements outside the period, a negative accrual, and a reversed period', () => {
    const base = { currency: 'USD' as const, periodStart: '2025-01-01', periodEnd: '2025-03-31', beginningBalanceMinor: 0 };
    expect(() => liabilityRollForward({ ...base, movements: [{ date: '2025-04-01', kind: 'accrual', amountMinor: 1 }] })).toThrow(
      'movements[0].date: 2025-04-01 is outside the period 2025-01-01 – 2025-03-31',
    );
    expect(() => liabilityRollForward({ ...base, movements: [{ date: '2025-02-01', kind: 'accrual', amountMinor: -1 }] })).toThrow(
      /movements\[0\].amountMinor: an accrual is not negative/,
    );
    expect(() => liabilityRollForward({ ...base, periodEnd: '2024-12-31', movements: [] })).toThrow(/before periodStart/);
    expect(() => liabilityRollForward({ ...base, movements: [{ date: '2025-02-01', kind: 'refund' as never, amountMinor: 1 }] })).toThrow(
      /movements\[0\].kind/,
    );
  });
});
