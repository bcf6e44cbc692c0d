import { describe, expect, it } from 'vitest';
import { multiplyMinorByDecimal } from '@/lib/money';
import { expectedCost } from '@/lib/reports';

describe('IAS 37 expected value of warranty cost', () => {
  // IAS 37 illustration (reference-values.md): sales 1,000,000; 90% no defect, 6% minor repairs
  // costing 30% of sales, 4% major repairs costing 70% → 0.06 × 300,000 + 0.04 × 700,000 = 46,000.
  it('gives 46,000 for the IAS 37 example (amounts in cents)', () => {
    const sales = 100_000_000; // 1,000,000.00
    const r = expectedCost([
      { label: 'no repair', probability: '0.90', costMinor: 0 },
      { label: 'minor repair', probability: '0.06', costMinor: multiplyMinorByDecimal(sales, '0.30') },
      { label: 'major repair', probability: '0.04', costMinor: multiplyMinorByDecimal(sales, '0.70') },
    ]);
    expect(r.expectedMinor).toBe(4_600_000); // 46,000.00
    expect(r.outcomes.map((o) => o.weightedExactMinor)).toEqual(['0', '1800000', '2800000']);
  });

  it('takes percentages too, and in a currency without minor units', () => {
    const r = expectedCost([
      { label: 'no repair', probability: '90%', costMinor: 0 },
      { label: 'minor repair', probability: '6%', costMinor: 300_000 },
      { label: 'major repair', probability: '4%', costMinor: 700_000 },
    ]);
    expect(r.expectedMinor).toBe(46_000);
  });

  it('rounds once, half away from zero: 0.5 × 3 minor = 1.5 → 2', () => {
    const r = expectedCost([
      { label: 'repair', probability: '0.5', costMinor: 3 },
      { label: 'none', probability: '0.5', costMinor: 0 },
    ]);
    expect(r).toMatchObject({ expectedMinor: 2, exactMinor: '1.5' });
  });

  it('refuses probabilities that do not sum to 1, or outside 0…1, naming the outcome', () => {
    expect(() =>
      expectedCost([
        { label: 'minor repair', probability: '0.06', costMinor: 1 },
        { label: 'major repair', probability: '0.04', costMinor: 1 },
      ]),
    ).toThrow('outcomes: the probabilities sum to 0.10, not 1; list every outcome, "no repair" included');
    expect(() => expectedCost([{ label: 'x', probability: '1.2', costMinor: 1 }])).toThrow(/outcomes\[0\] \(x\).probability: 1.2 is not between 0 and 1/);
    expect(() => expectedCost([{ label: 'x', probability: 'six', costMinor: 1 }])).toThrow(/is not a probability/);
    expect(() => expectedCost([])).toThrow(/at least one/);
  });
});
