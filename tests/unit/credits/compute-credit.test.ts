import { describe, expect, it } from 'vitest';
import { CreditInputError, computeChargebackMemo, computeCredit, describeBasis } from '@/lib/credits';
import { baseInput, priceList } from './fixtures';

// All expected amounts below are hand-worked from the credit rules of the product brief
// (parts at dealer net × quantity; labor = approved hours × min(dealer rate, brand maximum);
// freight as approved; half away from zero per line; total = sum of the rounded lines).

const motorLabor = { code: 'M-110', description: 'Replace rear hub motor', scheduledHours: '1.5', approvedHours: '1.5' };

describe('labor: hours × min(dealer rate, brand maximum)', () => {
  it('applies the brand cap when the dealer rate is above it: 1.5 h × 80.00 = 120.00 (dealer 95.00)', () => {
    const memo = computeCredit(baseInput({ labor: [motorLabor] }));
    const [line] = memo.lines;
    expect(line).toMatchObject({ kind: 'labor', status: 'credited', amountMinor: 12000, computedMinor: 12000 });
    expect(line?.basis).toMatchObject({ capApplied: true, rateAppliedMinor: 8000, dealerRateMinor: 9500, exactMinor: '12000' });
    expect(memo.totalMinor).toBe(12000);
    expect(describeBasis(line!, 'USD')).toBe(
      '1.5 h approved (schedule 1.5 h) × 80.00 USD/h (brand maximum; dealer rate 95.00 USD/h)',
    );
  });

  it('uses the dealer rate when it is under the cap: 1.5 h × 70.00 = 105.00 (max 80.00)', () => {
    const memo = computeCredit(baseInput({ labor: [motorLabor], laborRates: { dealerRateMinor: 7000, brandMaxRateMinor: 8000 } }));
    expect(memo.lines[0]).toMatchObject({ amountMinor: 10500, basis: { capApplied: false, rateAppliedMinor: 7000 } });
  });

  it('equal rates: no cap applied', () => {
    const memo = computeCredit(baseInput({ labor: [motorLabor], laborRates: { dealerRateMinor: 8000, brandMaxRateMinor: 8000 } }));
    expect(memo.lines[0]?.basis).toMatchObject({ capApplied: false });
  });

  it('pays the approved hours on a partial approval: 1.2 of 2.0 h × 80.00 = 96.00', () => {
    const memo = computeCredit(
      baseInput({ labor: [{ code: 'C-020', description: 'Replace controller', scheduledHours: '1.2', requestedHours: '2.0', approvedHours: '1.2' }] }),
    );
    expect(memo.lines[0]?.amountMinor).toBe(9600);
    expect(describeBasis(memo.lines[0]!, 'USD')).toContain('1.2 h approved (schedule 1.2 h, 2.0 h requested)');
  });

  it('withholds labor (amount 0, reason shown) until the repair is verified', () => {
    const memo = computeCredit(baseInput({ labor: [motorLabor], laborRelease: { state: 'not_verified' } }));
    expect(memo.lines[0]).toMatchObject({ status: 'withheld', amountMinor: 0, computedMinor: 0, basis: { withheldMinor: 12000 } });
    expect(memo.totalMinor).toBe(0);
    expect(describeBasis(memo.lines[0]!, 'USD')).toContain('120.00 USD withheld until the after-test verifies the repair');
  });

  it("releases labor on the rep's acceptance by hand, with the reason in the basis", () => {
    const memo = computeCredit(
      baseInput({ labor: [motorLabor], laborRelease: { state: 'accepted_by_rep', reason: 'after-test file unreadable; photos show the fix' } }),
    );
    expect(memo.lines[0]).toMatchObject({ status: 'credited', amountMinor: 12000 });
    expect(describeBasis(memo.lines[0]!, 'USD')).toContain('released by the rep: after-test file unreadable');
  });

  it('zero approved hours: not credited', () => {
    const memo = computeCredit(baseInput({ labor: [{ ...motorLabor, approvedHours: '0' }] }));
    expect(memo.lines[0]).toMatchObject({ status: 'not_credited', amountMinor: 0 });
  });
});

describe('rounding at half a cent, per line (house rule: half away from zero)', () => {
  const op = (code: string, hours: string) => ({ code, description: code, scheduledHours: hours, approvedHours: hours });
  const rates = (rate: number) => ({ dealerRateMinor: rate, brandMaxRateMinor: 100_000 });

  it('1.5 cents → 2 cents (0.10/h × 0.15 h)', () => {
    expect(computeCredit(baseInput({ labor: [op('A', '0.15')], laborRates: rates(10) })).totalMinor).toBe(2);
  });

  it('2.5 cents → 3 cents (0.10/h × 0.25 h)', () => {
    expect(computeCredit(baseInput({ labor: [op('A', '0.25')], laborRates: rates(10) })).lines[0]).toMatchObject({
      amountMinor: 3,
      basis: { exactMinor: '2.5' },
    });
  });

  it('−2.5 cents → −3 cents: the chargeback of a 2.5-cent labor line takes back exactly the 3 credited', () => {
    const memo = computeCredit(
      baseInput({
        parts: [{ partNumber: 'DSP-MONO-2', description: 'Display', category: 'display', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' }],
        labor: [op('A', '0.25')],
        laborRates: rates(10),
        chargeback: { reason: 'no_fault_found' },
      }),
    );
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([0, 3, -8800, -3]);
    expect(memo.totalMinor).toBe(-8800);
  });

  it('62.50/h × 0.45 h = 28.125 → 28.13, and 62.50/h × 0.05 h = 3.125 → 3.13', () => {
    const memo = computeCredit(baseInput({ labor: [op('A', '0.45'), op('B', '0.05')], laborRates: rates(6250) }));
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([2813, 313]);
  });

  it('rounds each line, then sums: two 2.5-cent lines total 6, not round(5.0) = 5', () => {
    const memo = computeCredit(baseInput({ labor: [op('A', '0.25'), op('B', '0.25')], laborRates: rates(10) }));
    expect(memo.totalMinor).toBe(6);
  });

  it('JPY (no minor unit): 4,500 yen/h × 1.25 h = 5,625; 4,500 × 0.3 = 1,350; 3,333 × 0.5 = 1,666.5 → 1,667', () => {
    const memo = computeCredit(
      baseInput({ currency: 'JPY', priceList: [], labor: [op('A', '1.25'), op('B', '0.3')], laborRates: rates(4500) }),
    );
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([5625, 1350]);
    const odd = computeCredit(baseInput({ currency: 'JPY', priceList: [], labor: [op('C', '0.5')], laborRates: rates(3333) }));
    expect(odd.totalMinor).toBe(1667);
  });
});

describe('parts and freight', () => {
  it('credits a part fitted from dealer stock at the dealer net in force on the price date, partial quantity', () => {
    const memo = computeCredit(
      baseInput({
        parts: [{ partNumber: 'CTL-36V-20A', description: 'Controller 36 V', category: 'controller', requestedQuantity: 2, approvedQuantity: 1, source: 'dealer_stock' }],
      }),
    );
    const [line] = memo.lines;
    expect(line).toMatchObject({ status: 'credited', amountMinor: 14250, category: 'controller' });
    expect(line?.basis).toMatchObject({ unitPriceMinor: 14250, priceListEffectiveFrom: '2025-01-01', quantity: 1, requestedQuantity: 2 });
    expect(describeBasis(line!, 'USD')).toBe('1 × 142.50 USD dealer net (price list from 2025-01-01); 1 of 2 requested approved');
  });

  it('takes a new price from its first day (2025-06-01 → 150.00) and the previous one the day before', () => {
    const part = { partNumber: 'CTL-36V-20A', description: 'Controller', category: 'controller', requestedQuantity: 3, approvedQuantity: 3, source: 'dealer_stock' as const };
    expect(computeCredit(baseInput({ priceDate: '2025-06-01', parts: [part] })).totalMinor).toBe(45000);
    expect(computeCredit(baseInput({ priceDate: '2025-05-31', parts: [part] })).totalMinor).toBe(42750);
  });

  it('does not credit a part the brand shipped (line shown at 0)', () => {
    const memo = computeCredit(
      baseInput({ parts: [{ partNumber: 'HUB-250-R', description: 'Rear hub motor', category: 'motor', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' }] }),
    );
    expect(memo.lines[0]).toMatchObject({ status: 'not_credited', amountMinor: 0, basis: { kind: 'part_shipped_by_brand' } });
  });

  it('credits freight as approved', () => {
    const memo = computeCredit(baseInput({ freight: { approvedMinor: 2500, requestedMinor: 3100 } }));
    expect(memo.lines[0]).toMatchObject({ kind: 'freight', amountMinor: 2500 });
    expect(describeBasis(memo.lines[0]!, 'USD')).toBe('freight allowance as approved (31.00 USD requested)');
  });
});

describe('chargebacks', () => {
  const motorShipped = { partNumber: 'HUB-250-R', description: 'Rear hub motor', category: 'motor', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' as const };

  it('no fault found: dealer net of the shipped motor and the labor credited, freight kept', () => {
    // 0 (shipped) + 120.00 labor + 25.00 freight − 389.00 motor − 120.00 labor = −364.00
    const memo = computeCredit(
      baseInput({ parts: [motorShipped], labor: [motorLabor], freight: { approvedMinor: 2500 }, chargeback: { reason: 'no_fault_found', note: 'motor ran to spec on the bench' } }),
    );
    expect(memo.lines.map((l) => [l.kind, l.status, l.amountMinor])).toEqual([
      ['part', 'not_credited', 0],
      ['labor', 'credited', 12000],
      ['freight', 'credited', 2500],
      ['chargeback', 'charged_back', -38900],
      ['chargeback', 'charged_back', -12000],
    ]);
    expect(memo.totalMinor).toBe(-36400);
    expect(memo.lines[3]?.basis).toMatchObject({ kind: 'chargeback_part', source: 'brand_shipped', unitPriceMinor: 38900, note: 'motor ran to spec on the bench' });
  });

  it('core not returned: the part only; the genuine repair keeps its labor', () => {
    const battery = { partNumber: 'BAT-36-14', description: 'Battery 36 V 14 Ah', category: 'battery', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' as const };
    const memo = computeCredit(
      baseInput({
        parts: [battery],
        labor: [{ code: 'B-010', description: 'Swap battery', scheduledHours: '0.8', approvedHours: '0.8' }],
        laborRates: { dealerRateMinor: 7500, brandMaxRateMinor: 8000 },
        chargeback: { reason: 'core_not_returned' },
      }),
    );
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([0, 6000, -51240]);
    expect(memo.totalMinor).toBe(-45240);
  });

  it('core not returned for a part fitted from stock: the part credit is taken back', () => {
    const memo = computeCredit(
      baseInput({
        parts: [{ partNumber: 'CTL-36V-20A', description: 'Controller', category: 'controller', requestedQuantity: 2, approvedQuantity: 2, source: 'dealer_stock' }],
        chargeback: { reason: 'core_not_returned', parts: [{ partNumber: 'CTL-36V-20A', quantity: 1 }] },
      }),
    );
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([28500, -14250]);
  });

  it('not covered, found after the credit was issued: a chargeback memo of the part and the earlier labor', () => {
    const memo = computeChargebackMemo({
      currency: 'USD',
      priceDate: '2025-03-10',
      priceList,
      parts: [{ partNumber: 'DSP-MONO-2', description: 'Display', category: 'display', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' }],
      chargeback: { reason: 'not_covered_at_inspection', note: 'impact crack behind the mount' },
      laborCreditedMinor: 4000,
      creditedOnMemos: ['CM-2025-001337-0'],
    });
    expect(memo.kind).toBe('chargeback');
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([-8800, -4000]);
    expect(memo.totalMinor).toBe(-12800);
    expect(describeBasis(memo.lines[1]!, 'USD')).toBe(
      'Damage not covered, found at inspection: labor credited on this claim (CM-2025-001337-0) taken back',
    );
  });

  it('adds the labor of earlier memos to a labor-reversing chargeback', () => {
    const memo = computeCredit(baseInput({ parts: [motorShipped], priorLaborCreditedMinor: 5000, chargeback: { reason: 'no_fault_found' } }));
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([0, -38900, -5000]);
  });
});

describe('bad input is refused with the field named', () => {
  const expectIssues = (fn: () => unknown) => {
    try {
      fn();
    } catch (e) {
      expect(e).toBeInstanceOf(CreditInputError);
      return (e as CreditInputError).issues.map((i) => `${i.path}: ${i.message}`);
    }
    throw new Error('expected a CreditInputError');
  };

  // Field checks come first; the cross-field checks (quantities, prices) run once the fields are sound.
  it('names each wrong field', () => {
    const issues = expectIssues(() =>
      computeCredit(
        baseInput({
          currency: 'usd' as never,
          priceDate: '2025-02-30',
          parts: [{ partNumber: 'CTL-36V-20A', description: 'Controller', category: 'controller', requestedQuantity: 1, approvedQuantity: 2, source: 'dealer_stock' }],
          labor: [{ code: 'M-1', description: 'x', scheduledHours: '1,5', approvedHours: '-1' }],
          laborRates: { dealerRateMinor: 95.5, brandMaxRateMinor: 8000 },
          freight: { approvedMinor: -1 },
        }),
      ),
    );
    expect(issues).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^currency: must be a supported ISO 4217 code \(USD, /),
        'priceDate: must be a real date written YYYY-MM-DD',
        expect.stringMatching(/^labor\[0\]\.scheduledHours: must be hours written as a decimal/),
        expect.stringMatching(/^labor\[0\]\.approvedHours: must be hours/),
        'laborRates.dealerRateMinor: must be a whole number of minor units',
        'freight.approvedMinor: must not be negative',
      ]),
    );
  });

  it('refuses a dealer-stock part with no price in force, and a chargeback of a part not on the claim', () => {
    const issues = expectIssues(() =>
      computeCredit(
        baseInput({
          priceDate: '2024-06-30',
          parts: [{ partNumber: 'CTL-36V-20A', description: 'Controller', category: 'controller', requestedQuantity: 1, approvedQuantity: 1, source: 'dealer_stock' }],
          chargeback: { reason: 'core_not_returned', parts: [{ partNumber: 'XX-1', quantity: 1 }] },
        }),
      ),
    );
    expect(issues).toEqual([
      'parts[0].partNumber: no dealer net price for CTL-36V-20A in the price list in force on 2024-06-30',
      "chargeback.parts[0].partNumber: XX-1 is not one of this claim's parts",
    ]);
  });

  it('refuses more approved hours than requested, a rep acceptance without reason, a part listed twice', () => {
    const part = { partNumber: 'HUB-250-R', description: 'Motor', category: 'motor', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' as const };
    const issues = expectIssues(() =>
      computeCredit(
        baseInput({
          parts: [part, { ...part, approvedQuantity: 2 }],
          labor: [{ code: 'M', description: 'x', scheduledHours: '1', requestedHours: '1.0', approvedHours: '1.25' }],
          laborRelease: { state: 'accepted_by_rep', reason: ' ' },
        }),
      ),
    );
    expect(issues).toEqual(
      expect.arrayContaining([
        'parts[1].partNumber: HUB-250-R is already listed as parts[0]',
        'parts[1].approvedQuantity: 2 is more than the 1 requested',
        'labor[0].approvedHours: 1.25 h is more than the 1.0 h requested',
        'laborRelease.reason: is required',
      ]),
    );
  });
});
