import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDays } from '@/lib/calendar';
import { matchStatement, type MemoForMatching, type StatementLine } from '@/lib/reconciliation';

// The indexed matcher against a plain quadratic restatement of the amount-and-date rule:
// a line is proposed for a memo only when each is the other's only fit.
function oracle(lines: StatementLine[], memos: MemoForMatching[], window: number) {
  const day = (d: string) => Date.parse(`${d}T00:00:00Z`) / 86_400_000;
  const fits = (l: StatementLine, m: MemoForMatching) =>
    l.dealerId === m.dealerId && l.currency === m.currency && l.amountMinor === m.totalMinor && Math.abs(day(l.date) - day(m.issuedOn)) <= window;
  const matches: [number, string][] = [];
  for (const l of lines) {
    const ms = memos.filter((m) => fits(l, m));
    if (ms.length === 1 && lines.filter((x) => fits(x, ms[0]!)).length === 1) matches.push([l.lineNo, ms[0]!.id]);
  }
  return matches;
}

const arb = fc.record({
  window: fc.integer({ min: 0, max: 10 }),
  lines: fc.array(
    fc.record({ amount: fc.integer({ min: 1, max: 4 }), day: fc.integer({ min: 0, max: 40 }), dealer: fc.constantFrom('A', 'B'), eur: fc.boolean() }),
    { maxLength: 25 },
  ),
  memos: fc.array(
    fc.record({ amount: fc.integer({ min: 1, max: 4 }), day: fc.integer({ min: 0, max: 40 }), dealer: fc.constantFrom('A', 'B'), eur: fc.boolean() }),
    { maxLength: 25 },
  ),
});

describe('amount-and-date matching agrees with a brute-force restatement', () => {
  it('on random small statements', () => {
    fc.assert(
      fc.property(arb, ({ window, lines, memos }) => {
        const ls: StatementLine[] = lines.map((l, i) => ({
          lineNo: i + 2,
          amountMinor: l.amount * 100,
          date: addDays('2025-01-01', l.day),
          currency: l.eur ? 'EUR' : 'USD',
          dealerId: l.dealer,
        }));
        const ms: MemoForMatching[] = memos.map((m, i) => ({
          id: `m${i}`,
          number: `X${i}`, // too short to be searched as a reference
          claimNumber: `C${i}`,
          dealerId: m.dealer,
          currency: m.eur ? 'EUR' : 'USD',
          totalMinor: m.amount * 100,
          issuedOn: addDays('2025-01-01', m.day),
        }));
        const r = matchStatement(ls, ms, { dateWindowDays: window });
        expect(r.matches.map((m) => [m.lineNo, m.memoId])).toEqual(oracle(ls, ms, window));
        // Every line lands in exactly one of the three outputs; every memo is matched or unmatched.
        const seen = [...r.matches, ...r.ambiguous, ...r.unmatchedLines].map((x) => x.lineNo).sort((a, b) => a - b);
        expect(seen).toEqual(ls.map((l) => l.lineNo));
        expect(r.matches.length + r.unmatchedMemos.length).toBe(ms.length);
      }),
      { numRuns: 800 },
    );
  });
});
