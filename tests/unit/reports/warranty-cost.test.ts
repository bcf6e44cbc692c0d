import { describe, expect, it } from 'vitest';
import { computeCredit, reverseMemo, type CreditInput } from '@/lib/credits';
import { warrantyCost, type MemoForCostReport, type ShipmentAtCost } from '@/lib/reports';

// Invented scenario; every expected figure is the hand sum of the lines shown in the comments.
const base: Omit<CreditInput, 'parts' | 'labor'> = {
  currency: 'USD',
  priceDate: '2025-03-01',
  priceList: [
    { partNumber: 'CTL-36V-20A', dealerNetMinor: 14250, effectiveFrom: '2025-01-01' },
    { partNumber: 'HUB-250-R', dealerNetMinor: 38900, effectiveFrom: '2025-01-01' },
  ],
  laborRates: { dealerRateMinor: 8000, brandMaxRateMinor: 8000 },
  laborRelease: { state: 'verified_by_test' },
};
// Memo A (March, controller claim): controller from stock 142.50 + labor 1 h 80.00 + freight 10.00
const a = computeCredit({
  ...base,
  parts: [{ partNumber: 'CTL-36V-20A', description: 'Controller', category: 'controller', requestedQuantity: 1, approvedQuantity: 1, source: 'dealer_stock' }],
  labor: [{ code: 'C-1', description: 'Replace controller', scheduledHours: '1', approvedHours: '1' }],
  freight: { approvedMinor: 1000 },
});
// Memo B (April, motor claim, no fault found): shipped motor 0 + labor 1.5 h 120.00 − motor 389.00 − labor 120.00
const b = computeCredit({
  ...base,
  parts: [{ partNumber: 'HUB-250-R', description: 'Motor', category: 'motor', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' }],
  labor: [{ code: 'M-1', description: 'Replace motor', scheduledHours: '1.5', approvedHours: '1.5' }],
  chargeback: { reason: 'no_fault_found' },
});
const memos: MemoForCostReport[] = [
  { number: 'CM-2025-000001-3', issuedOn: '2025-03-20', currency: 'USD', claimPart: { partNumber: 'CTL-36V-20A', category: 'controller' }, lines: a.lines },
  { number: 'CM-2025-000002-1', issuedOn: '2025-04-02', currency: 'USD', claimPart: { partNumber: 'HUB-250-R', category: 'motor' }, lines: b.lines },
];
// The motor shipped in March at the brand's cost 251.00
const shipments: ShipmentAtCost[] = [
  { rmaNumber: 'RMA-2025-000042-7', shippedOn: '2025-03-12', currency: 'USD', partNumber: 'HUB-250-R', category: 'motor', quantity: 1, unitCostMinor: 25100 },
];

describe('warranty cost', () => {
  it('by month (ISO yyyy-mm)', () => {
    const r = warrantyCost({ currency: 'USD', memos, shipments }, 'month');
    expect(r.rows).toEqual([
      // March: 142.50 + 80.00 + 10.00 + shipped 251.00 = 483.50
      { key: '2025-03', partsCreditedMinor: 14250, laborMinor: 8000, freightMinor: 1000, chargebacksMinor: 0, shippedPartsAtCostMinor: 25100, totalMinor: 48350 },
      // April: labor 120.00 − 389.00 − 120.00 = −389.00
      { key: '2025-04', partsCreditedMinor: 0, laborMinor: 12000, freightMinor: 0, chargebacksMinor: -50900, shippedPartsAtCostMinor: 0, totalMinor: -38900 },
    ]);
    expect(r.totals.totalMinor).toBe(48350 - 38900);
  });

  it('by part category and by part number: labor and freight go to the claim part', () => {
    const byCategory = warrantyCost({ currency: 'USD', memos, shipments }, 'category');
    expect(byCategory.rows.map((x) => [x.key, x.totalMinor])).toEqual([
      ['controller', 23250], // 142.50 + 80.00 + 10.00
      ['motor', -13800], // 251.00 + 120.00 − 389.00 − 120.00
    ]);
    const byPart = warrantyCost({ currency: 'USD', memos, shipments }, 'part_number');
    expect(byPart.rows.map((x) => x.key)).toEqual(['CTL-36V-20A', 'HUB-250-R']);
    expect(byPart.totals).toEqual(byCategory.totals);
  });

  it('a reversal memo takes its memo back out', () => {
    const r = reverseMemo({ ...a, number: 'CM-2025-000001-3' }, 'issued twice');
    const withReversal = [...memos, { ...memos[0]!, number: 'CM-2025-000003-9', issuedOn: '2025-04-10', lines: r.lines }];
    const report = warrantyCost({ currency: 'USD', memos: withReversal, shipments: [] }, 'category');
    expect(report.rows.find((x) => x.key === 'controller')?.totalMinor).toBe(0);
  });

  it('filters by period and refuses another currency', () => {
    const march = warrantyCost({ currency: 'USD', memos, shipments, from: '2025-03-01', to: '2025-03-31' }, 'month');
    expect(march.rows.map((x) => x.key)).toEqual(['2025-03']);
    expect(() => warrantyCost({ currency: 'EUR', memos, shipments }, 'month')).toThrow('memo CM-2025-000001-3: in USD, but the report is in EUR');
    expect(() => warrantyCost({ currency: 'USD', memos: [], shipments: [{ ...shipments[0]!, quantity: 0 }] }, 'month')).toThrow(/quantity must be/);
  });
});
