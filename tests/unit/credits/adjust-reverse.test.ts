import { describe, expect, it } from 'vitest';
import { CreditInputError, adjustLine, computeCredit, describeBasis, reverseMemo } from '@/lib/credits';
import { baseInput } from './fixtures';

const memo = computeCredit(
  baseInput({
    parts: [{ partNumber: 'CTL-36V-20A', description: 'Controller', category: 'controller', requestedQuantity: 1, approvedQuantity: 1, source: 'dealer_stock' }],
    labor: [{ code: 'C-020', description: 'Replace controller', scheduledHours: '0.25', approvedHours: '0.25' }],
    laborRates: { dealerRateMinor: 10, brandMaxRateMinor: 8000 },
    freight: { approvedMinor: 2500 },
  }),
);
// Hand-worked: 142.50 + 0.25 h × 0.10 (2.5 cents → 3) + 25.00 = 167.53
const edit = { by: 'accountant-7', at: '2025-04-02T10:15:00Z' };

describe('accountant edits', () => {
  it('records the edit against the computed value and recomputes the total', () => {
    expect(memo.totalMinor).toBe(16753);
    const once = adjustLine(memo, { ...edit, lineNo: 3, amountMinor: 1800, reason: 'freight invoice shows 18.00' });
    const twice = adjustLine(once, { ...edit, lineNo: 3, amountMinor: 2000, reason: 'second invoice page adds 2.00' });
    const freight = twice.lines[2];
    expect(freight).toMatchObject({ computedMinor: 2500, amountMinor: 2000 });
    expect(freight?.adjustments.map((a) => [a.fromMinor, a.toMinor, a.deltaMinor])).toEqual([
      [2500, 1800, -700],
      [1800, 2000, -500],
    ]);
    expect(once.totalMinor).toBe(16053);
    expect(twice.totalMinor).toBe(16253);
    expect(memo.totalMinor).toBe(16753); // the original is untouched
    expect(describeBasis(freight!, 'USD')).toBe('freight allowance as approved; edited from 25.00 USD to 20.00 USD: second invoice page adds 2.00');
  });

  const refused = (fn: () => unknown) => {
    try {
      fn();
    } catch (e) {
      expect(e).toBeInstanceOf(CreditInputError);
      return (e as Error).message;
    }
    throw new Error('expected a refusal');
  };

  it('refuses an edit without a reason, of a missing line, making a credit negative, or of withheld labor', () => {
    expect(refused(() => adjustLine(memo, { ...edit, lineNo: 3, amountMinor: 0, reason: '  ' }))).toBe('reason: say why the line is changed');
    expect(refused(() => adjustLine(memo, { ...edit, lineNo: 9, amountMinor: 0, reason: 'x' }))).toBe('lineNo: the memo has no line 9');
    expect(refused(() => adjustLine(memo, { ...edit, lineNo: 1, amountMinor: -1, reason: 'x' }))).toMatch(/cannot become negative/);
    expect(refused(() => adjustLine(memo, { ...edit, lineNo: 1, amountMinor: 1.5, reason: 'x' }))).toMatch(/amountMinor: must be a whole number/);
    const withheld = computeCredit(
      baseInput({ labor: [{ code: 'M', description: 'x', scheduledHours: '1', approvedHours: '1' }], laborRelease: { state: 'not_verified' } }),
    );
    expect(refused(() => adjustLine(withheld, { ...edit, lineNo: 1, amountMinor: 100, reason: 'pay it' }))).toMatch(/withheld until the repair is verified/);
  });

  it('refuses turning a chargeback into a credit', () => {
    const nff = computeCredit(
      baseInput({
        parts: [{ partNumber: 'HUB-250-R', description: 'Motor', category: 'motor', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' }],
        chargeback: { reason: 'no_fault_found' },
      }),
    );
    expect(refused(() => adjustLine(nff, { ...edit, lineNo: 2, amountMinor: 5, reason: 'goodwill' }))).toMatch(/is a chargeback/);
    expect(adjustLine(nff, { ...edit, lineNo: 2, amountMinor: -19450, reason: 'goodwill: half charged' }).totalMinor).toBe(-19450);
  });
});

describe('reversal memo', () => {
  it('negates every posted line, adjustments included, so memo + reversal = 0', () => {
    const adjusted = adjustLine(memo, { ...edit, lineNo: 3, amountMinor: 1800, reason: 'freight invoice shows 18.00' });
    const reversal = reverseMemo({ ...adjusted, number: 'CM-2025-001337-0' }, 'issued to the wrong dealer account');
    expect(reversal.kind).toBe('reversal');
    expect(reversal.reversal).toEqual({ reversesMemoNumber: 'CM-2025-001337-0', reason: 'issued to the wrong dealer account' });
    expect(reversal.lines.map((l) => [l.lineNo, l.reversesLineNo, l.amountMinor])).toEqual([
      [1, 1, -14250],
      [2, 2, -3], // the 2.5-cent line: −3, not −2
      [3, 3, -1800],
    ]);
    expect(reversal.totalMinor + adjusted.totalMinor).toBe(0);
    expect(describeBasis(reversal.lines[0]!, 'USD')).toMatch(/^reverses line 1: 1 × 142.50 USD/);
  });

  it('leaves out zero lines and refuses to reverse a reversal or to reverse without a reason', () => {
    const withZero = computeCredit(
      baseInput({ parts: [{ partNumber: 'HUB-250-R', description: 'Motor', category: 'motor', requestedQuantity: 1, approvedQuantity: 1, source: 'brand_shipped' }], freight: { approvedMinor: 900 } }),
    );
    const r = reverseMemo({ ...withZero, number: 'CM-2025-000001-3' }, 'duplicate');
    expect(r.lines).toHaveLength(1);
    expect(() => reverseMemo({ ...r, number: 'CM-2025-000002-1' }, 'again')).toThrow(/already a reversal/);
    expect(() => reverseMemo({ ...withZero, number: 'CM-2025-000001-3' }, '')).toThrow(/reason: say why/);
    expect(() => adjustLine(r, { ...edit, lineNo: 1, amountMinor: -100, reason: 'x' })).toThrow(/reversal memo is not edited/);
  });
});
