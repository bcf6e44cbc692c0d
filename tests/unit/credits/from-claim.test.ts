import { describe, expect, it } from 'vitest';
import { computeCredit } from '@/lib/credits';
import { approvedLinesOf, chargebackOf, creditInputFromClaim, laborReleaseOf, netLaborCredited, type ClaimForCredit } from '@/lib/credits/from-claim';
import { priceList } from './fixtures';

// Invented values (see fixtures.ts); the arithmetic is worked by hand in each test's name.
const requested = {
  parts: [
    { lineId: 'p1', partNumber: 'CTL-36V-20A', name: 'Controller 36 V', quantity: 2, fromDealerStock: true },
    { lineId: 'p2', partNumber: 'HUB-250-R', name: 'Hub motor', quantity: 1, fromDealerStock: false },
  ],
  labor: [
    { lineId: 'l1', code: 'CTL', description: 'Replace controller', hours: '1.00' },
    { lineId: 'l2', code: 'TEST', description: 'Load test', hours: '0.75' },
  ],
  freightMinor: 2500,
};

function claim(over: Partial<ClaimForCredit> = {}): ClaimForCredit {
  return {
    currency: 'USD', requested, approved: null,
    approvalFlags: [{ lineId: 'p1', approved: true }, { lineId: 'p2', approved: true }, { lineId: 'l1', approved: true }, { lineId: 'l2', approved: true }],
    afterTest: { outcome: 'passed', acceptedReason: null }, chargebackReasons: [], inspectionNotes: null, priceDate: '2025-03-10',
    laborRates: { dealerRateMinor: 9500, brandMaxRateMinor: 8000 }, ...over,
  };
}
const catalog = { partCategories: { 'CTL-36V-20A': 'controller', 'HUB-250-R': 'drive_unit' }, scheduledHours: { CTL: '1.00', TEST: '0.50' }, priceList };

describe('a claim’s credit input', () => {
  it('full approval: 2 × 142.50 from stock, the shipped motor at 0, (1.00 + 0.75) h × 80.00 capped, freight 25.00 = 450.00', () => {
    const memo = computeCredit(creditInputFromClaim(claim(), catalog));
    expect(memo.lines.map((l) => l.amountMinor)).toEqual([28500, 0, 8000, 6000, 2500]);
    expect(memo.totalMinor).toBe(45000);
    expect(memo.lines[3]!.basis).toMatchObject({ scheduledHours: '0.50', requestedHours: '0.75', approvedHours: '0.75', capApplied: true });
  });

  it('recorded approved lines win: 1 of 2 controllers and 0.50 of 0.75 h; a line left out is approved at 0', () => {
    const approved = { parts: [{ ...requested.parts[0]!, quantity: 1 }], labor: [{ ...requested.labor[1]!, hours: '0.50' }], freightMinor: 1000 };
    const memo = computeCredit(creditInputFromClaim(claim({ approved }), catalog));
    // 142.50 + 0 (motor not approved) + 0 (l1 not approved) + 0.50 h × 80.00 = 40.00 + freight 10.00
    expect(memo.lines.map((l) => [l.status, l.amountMinor])).toEqual([
      ['credited', 14250], ['not_credited', 0], ['not_credited', 0], ['credited', 4000], ['credited', 1000],
    ]);
  });

  it('the machine’s per-line verdicts apply without recorded lines; a refused freight line is 0', () => {
    const flags = [{ lineId: 'p1', approved: false }, { lineId: 'p2', approved: true }, { lineId: 'l1', approved: true }, { lineId: 'freight', approved: false }];
    const a = approvedLinesOf(claim({ approvalFlags: flags }));
    expect(a.parts.map((p) => p.approvedQuantity)).toEqual([0, 1]);
    expect(a.labor.map((l) => l.approvedHours)).toEqual(['1.00', '0']);
    expect(a.freightMinor).toBe(0);
  });

  it('releases labor only on a passed after-test or the rep’s acceptance', () => {
    expect(laborReleaseOf({ outcome: 'passed', acceptedReason: null })).toEqual({ state: 'verified_by_test' });
    expect(laborReleaseOf({ outcome: 'accepted_by_hand', acceptedReason: 'road test fine' })).toEqual({ state: 'accepted_by_rep', reason: 'road test fine' });
    expect(laborReleaseOf({ outcome: 'failed', acceptedReason: null }).state).toBe('not_verified');
    const withheld = computeCredit(creditInputFromClaim(claim({ afterTest: { outcome: 'fitted' as never, acceptedReason: null } }), catalog));
    expect(withheld.lines.filter((l) => l.kind === 'labor').map((l) => [l.status, l.amountMinor])).toEqual([['withheld', 0], ['withheld', 0]]);
  });

  it('maps the machine’s chargeback reasons to the credit rules, with the inspection notes', () => {
    expect(chargebackOf(['not_covered'], ' impact ')).toEqual({ reason: 'not_covered_at_inspection', note: 'impact' });
    expect(chargebackOf(['core_not_returned'], null)).toEqual({ reason: 'core_not_returned' });
    expect(chargebackOf([], 'x')).toBeUndefined();
    const nff = computeCredit(creditInputFromClaim(claim({ chargebackReasons: ['no_fault_found'], inspectionNotes: 'bench ok' }), catalog));
    // −2 × 142.50 and −389.00 at dealer net, −140.00 labor; freight kept: 450.00 − 285.00 − 389.00 − 140.00 = −364.00
    expect(nff.totalMinor).toBe(-36400);
  });

  it('labor still credited nets labor lines, their reversals and labor chargebacks', () => {
    const memo = computeCredit(creditInputFromClaim(claim(), catalog));
    expect(netLaborCredited(memo.lines)).toBe(14000);
    const taken = computeCredit(creditInputFromClaim(claim({ chargebackReasons: ['no_fault_found'] }), catalog));
    expect(netLaborCredited(taken.lines)).toBe(0);
  });
});
