import fc from 'fast-check';
import { bignumber } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeCredit, type ApprovedPart, type CreditInput } from '@/lib/credits';

// Independent recomputation: BigInt for products and sums, decimal.js (through mathjs BigNumber)
// ROUND_HALF_UP for the one rounding of hours × rate. Nothing here calls lib/money.
const HALF_UP = 4;

const hoursArb = fc
  .tuple(fc.integer({ min: 0, max: 1200 }), fc.integer({ min: 0, max: 3 }))
  .map(([units, scale]) => (units / 10 ** scale).toFixed(scale));

const inputArb = fc
  .record({
    parts: fc.uniqueArray(
      fc.record({
        n: fc.integer({ min: 1, max: 9999 }),
        requested: fc.integer({ min: 1, max: 6 }),
        approvedShare: fc.integer({ min: 0, max: 6 }),
        source: fc.constantFrom('dealer_stock' as const, 'brand_shipped' as const),
        price: fc.integer({ min: 0, max: 5_000_000 }),
      }),
      { selector: (p) => p.n, maxLength: 8 },
    ),
    labor: fc.array(hoursArb, { maxLength: 8 }),
    dealerRate: fc.integer({ min: 0, max: 50_000 }),
    brandMax: fc.integer({ min: 0, max: 50_000 }),
    release: fc.constantFrom('verified_by_test' as const, 'not_verified' as const),
    freight: fc.option(fc.integer({ min: 0, max: 200_000 }), { nil: undefined }),
    chargeback: fc.option(fc.constantFrom('no_fault_found' as const, 'core_not_returned' as const, 'not_covered_at_inspection' as const), {
      nil: undefined,
    }),
  })
  .map((g) => {
    const parts: ApprovedPart[] = g.parts.map((p) => ({
      partNumber: `P-${p.n}`,
      description: `part ${p.n}`,
      category: 'motor',
      requestedQuantity: p.requested,
      approvedQuantity: Math.min(p.approvedShare, p.requested),
      source: p.source,
    }));
    const input: CreditInput = {
      currency: 'EUR',
      priceDate: '2025-04-01',
      priceList: g.parts.map((p) => ({ partNumber: `P-${p.n}`, dealerNetMinor: p.price, effectiveFrom: '2025-01-01' })),
      parts,
      labor: g.labor.map((h, i) => ({ code: `L${i}`, description: `op ${i}`, scheduledHours: h, approvedHours: h })),
      laborRates: { dealerRateMinor: g.dealerRate, brandMaxRateMinor: g.brandMax },
      laborRelease: { state: g.release },
      ...(g.freight === undefined ? {} : { freight: { approvedMinor: g.freight } }),
      ...(g.chargeback === undefined ? {} : { chargeback: { reason: g.chargeback } }),
    };
    return { input, prices: new Map(g.parts.map((p) => [`P-${p.n}`, BigInt(p.price)])) };
  });

function recompute({ input, prices }: { input: CreditInput; prices: Map<string, bigint> }): bigint {
  const price = (pn: string) => prices.get(pn) ?? 0n;
  let total = 0n;
  for (const p of input.parts) {
    if (p.source === 'dealer_stock') total += price(p.partNumber) * BigInt(p.approvedQuantity);
  }
  const rate = Math.min(input.laborRates.dealerRateMinor, input.laborRates.brandMaxRateMinor);
  let labor = 0n;
  if (input.laborRelease.state !== 'not_verified') {
    for (const op of input.labor) {
      labor += BigInt(bignumber(rate).times(bignumber(op.approvedHours)).toDecimalPlaces(0, HALF_UP).toFixed(0));
    }
  }
  total += labor + BigInt(input.freight?.approvedMinor ?? 0);
  const cb = input.chargeback?.reason;
  if (cb) {
    for (const p of input.parts) total -= price(p.partNumber) * BigInt(p.approvedQuantity);
    if (cb !== 'core_not_returned') total -= labor;
  }
  return total;
}

describe('money is never a float: random memos', () => {
  it('total = sum of the rounded lines exactly = an independent BigInt / decimal.js recomputation', () => {
    fc.assert(
      fc.property(inputArb, (generated) => {
        const memo = computeCredit(generated.input);
        let running = 0;
        for (const line of memo.lines) {
          expect(Number.isSafeInteger(line.amountMinor)).toBe(true);
          running += line.amountMinor;
          expect(Number.isSafeInteger(running)).toBe(true);
        }
        expect(memo.totalMinor).toBe(running);
        expect(BigInt(memo.totalMinor)).toBe(memo.lines.reduce((a, l) => a + BigInt(l.amountMinor), 0n));
        expect(BigInt(memo.totalMinor)).toBe(recompute(generated));
      }),
      { numRuns: 1500 },
    );
  });
});
