import { describe, expect, it } from 'vitest';
import { ReconciliationInputError, matchStatement, normalizeReference } from '@/lib/reconciliation';
import { line, memo } from './fixtures';

// Constructed statements: each expectation follows from the matching rules in lib/reconciliation/README.md.
const opts = { dateWindowDays: 5 };

describe('by reference', () => {
  const m1 = memo(1, 16753, '2025-03-03'); // CM-2025-000001-3
  const m2 = memo(2, 12000, '2025-03-04');

  it('finds the memo number in the reference whatever the case, spaces or dashes', () => {
    for (const reference of ['CM-2025-000001-3', 'paid cm 2025 000001 3 thanks', 'Ref:CM2025-0000013', 'cm-2025-000001-3/Mar']) {
      const r = matchStatement([line(7, 16753, '2025-04-20', { reference })], [m1, m2], opts);
      expect(r.matches).toEqual([{ lineNo: 7, memoId: 'm1', basis: 'reference', referenceField: 'memo_number', amountDifferenceMinor: 0, daysApart: 48 }]);
      expect(r.unmatchedMemos).toEqual(['m2']);
    }
  });

  it('matches on the claim or RMA number too, and reports a short payment as an amount difference', () => {
    const r = matchStatement(
      [line(1, 16000, '2025-03-05', { reference: `claim ${m1.claimNumber}` }), line(2, 12000, '2025-03-06', { reference: `RMA ${m2.rmaNumber}` })],
      [m1, m2],
      opts,
    );
    expect(r.matches.map((m) => [m.lineNo, m.memoId, m.referenceField, m.amountDifferenceMinor])).toEqual([
      [1, 'm1', 'claim_number', -753],
      [2, 'm2', 'rma_number', 0],
    ]);
  });

  it('does not find a number inside a longer run of digits', () => {
    const r = matchStatement([line(1, 555, '2025-03-05', { reference: 'CM-2025-000001-39' })], [m1], opts);
    expect(r.matches).toEqual([]);
    expect(r.unmatchedLines).toEqual([{ lineNo: 1, reason: 'no_candidate' }]);
    expect(normalizeReference(' cm-2025/000001.3 ')).toBe('CM20250000013');
  });

  it('two memos on one claim: the one of the same amount is proposed; neither → ambiguous', () => {
    const credit = memo(10, 20000, '2025-03-01');
    const chargeback = memo(11, -5000, '2025-03-20', { claimNumber: credit.claimNumber, rmaNumber: credit.rmaNumber });
    const r = matchStatement(
      [line(1, -5000, '2025-03-21', { reference: credit.claimNumber }), line(2, 777, '2025-03-21', { reference: credit.rmaNumber! })],
      [credit, chargeback],
      opts,
    );
    expect(r.matches).toEqual([{ lineNo: 1, memoId: 'm11', basis: 'reference', referenceField: 'claim_number', amountDifferenceMinor: 0, daysApart: 1 }]);
    expect(r.ambiguous).toEqual([
      {
        lineNo: 2,
        basis: 'reference',
        reason: 'several_memos',
        candidateCount: 2,
        candidates: [
          { memoId: 'm10', memoNumber: credit.number, referenceField: 'rma_number', daysApart: 20 },
          { memoId: 'm11', memoNumber: chargeback.number, referenceField: 'rma_number', daysApart: 1 },
        ],
      },
    ]);
  });

  it('two lines naming the same memo: both ambiguous, neither picked', () => {
    const r = matchStatement(
      [line(1, 16753, '2025-03-05', { reference: m1.number }), line(2, 16753, '2025-03-06', { reference: m1.number })],
      [m1],
      opts,
    );
    expect(r.matches).toEqual([]);
    expect(r.ambiguous.map((a) => [a.lineNo, a.reason, a.candidates[0]?.memoId])).toEqual([
      [1, 'memo_wanted_by_several_lines', 'm1'],
      [2, 'memo_wanted_by_several_lines', 'm1'],
    ]);
  });

  it("refuses another dealer's memo named in the reference", () => {
    const south = memo(3, 9900, '2025-03-03', { dealerId: 'D-SOUTH' });
    const r = matchStatement([line(1, 9900, '2025-03-04', { reference: south.number })], [south], opts);
    expect(r.matches).toEqual([]);
    expect(r.unmatchedLines).toEqual([{ lineNo: 1, reason: 'reference_other_dealer' }]);
    expect(r.unmatchedMemos).toEqual(['m3']);
  });

  it('refuses a memo in another currency named in the reference', () => {
    const eur = memo(4, 9900, '2025-03-03', { currency: 'EUR' });
    const r = matchStatement([line(1, 9900, '2025-03-04', { reference: eur.number })], [eur], opts);
    expect(r.unmatchedLines).toEqual([{ lineNo: 1, reason: 'reference_other_currency' }]);
  });
});

describe('by amount within the date window', () => {
  it('proposes the one memo of the same amount, same dealer, within ± N days (edges included)', () => {
    const memos = [memo(1, 4500, '2025-03-10'), memo(2, 4500, '2025-02-01'), memo(3, 4501, '2025-03-10')];
    const r = matchStatement([line(1, 4500, '2025-03-15')], memos, opts);
    expect(r.matches).toEqual([{ lineNo: 1, memoId: 'm1', basis: 'amount_date', amountDifferenceMinor: 0, daysApart: 5 }]);
    expect(matchStatement([line(1, 4500, '2025-03-16')], memos, opts).unmatchedLines).toEqual([{ lineNo: 1, reason: 'no_candidate' }]);
    expect(matchStatement([line(1, 4500, '2025-03-05')], memos, opts).matches[0]?.daysApart).toBe(-5);
  });

  it('falls back to amount when the reference names nothing known', () => {
    const r = matchStatement([line(1, 4500, '2025-03-11', { reference: 'March warranty' })], [memo(1, 4500, '2025-03-10')], opts);
    expect(r.matches[0]).toMatchObject({ memoId: 'm1', basis: 'amount_date' });
  });

  it('two memos of the same amount in the window: ambiguous with both candidates, not auto-picked', () => {
    const r = matchStatement([line(1, 4500, '2025-03-12')], [memo(1, 4500, '2025-03-10'), memo(2, 4500, '2025-03-14')], opts);
    expect(r.matches).toEqual([]);
    expect(r.ambiguous).toEqual([
      {
        lineNo: 1,
        basis: 'amount_date',
        reason: 'several_memos',
        candidateCount: 2,
        candidates: [
          { memoId: 'm1', memoNumber: 'CM-2025-000001-3', daysApart: 2 },
          { memoId: 'm2', memoNumber: 'CM-2025-000002-1', daysApart: -2 },
        ],
      },
    ]);
    expect(r.unmatchedMemos).toEqual(['m1', 'm2']);
  });

  it('two lines of the same amount wanting one memo: both ambiguous', () => {
    const r = matchStatement([line(1, 4500, '2025-03-11'), line(2, 4500, '2025-03-12')], [memo(1, 4500, '2025-03-10')], opts);
    expect(r.ambiguous.map((a) => [a.lineNo, a.reason])).toEqual([
      [1, 'memo_wanted_by_several_lines'],
      [2, 'memo_wanted_by_several_lines'],
    ]);
  });

  it('never matches across dealers, even with the same amount and date', () => {
    const r = matchStatement([line(1, 4500, '2025-03-10')], [memo(1, 4500, '2025-03-10', { dealerId: 'D-SOUTH' })], opts);
    expect(r.matches).toEqual([]);
    expect(r.unmatchedLines).toEqual([{ lineNo: 1, reason: 'no_candidate' }]);
  });

  it('never matches across currencies', () => {
    const r = matchStatement([line(1, 4500, '2025-03-10', { currency: 'EUR' })], [memo(1, 4500, '2025-03-10')], opts);
    expect(r.matches).toEqual([]);
    expect(r.unmatchedLines).toEqual([{ lineNo: 1, reason: 'no_candidate' }]);
  });

  it('takes the dealer from the statement; without one a line is not amount-matched', () => {
    const m = memo(1, 4500, '2025-03-10');
    const noDealer = line(1, 4500, '2025-03-10', { dealerId: undefined });
    expect(matchStatement([noDealer], [m], opts).unmatchedLines).toEqual([{ lineNo: 1, reason: 'no_dealer' }]);
    expect(matchStatement([noDealer], [m], { ...opts, statementDealerId: 'D-NORTH' }).matches).toHaveLength(1);
    expect(() => matchStatement([line(1, 1, '2025-03-10')], [m], { ...opts, statementDealerId: 'D-SOUTH' })).toThrow(
      /statement line 1: dealer D-NORTH differs from the statement's dealer D-SOUTH/,
    );
  });

  it('does not offer a memo already matched by reference to another line', () => {
    const m = memo(1, 4500, '2025-03-10');
    const r = matchStatement([line(1, 4500, '2025-03-10', { reference: m.number }), line(2, 4500, '2025-03-10')], [m], opts);
    expect(r.matches.map((x) => [x.lineNo, x.basis])).toEqual([[1, 'reference']]);
    expect(r.unmatchedLines).toEqual([{ lineNo: 2, reason: 'no_candidate' }]);
  });

  it('lists at most maxCandidatesListed candidates but counts them all', () => {
    const memos = Array.from({ length: 30 }, (_, i) => memo(i + 1, 1000, '2025-03-10'));
    const r = matchStatement([line(1, 1000, '2025-03-10')], memos, { ...opts, maxCandidatesListed: 3 });
    expect(r.ambiguous[0]).toMatchObject({ candidateCount: 30 });
    expect(r.ambiguous[0]?.candidates).toHaveLength(3);
  });
});

describe('nothing to match and bad input', () => {
  it('reports unmatched on both sides', () => {
    const r = matchStatement([line(1, 1, '2025-01-01')], [memo(1, 2, '2025-06-01'), memo(2, 3, '2025-05-01')], opts);
    expect(r).toEqual({ matches: [], ambiguous: [], unmatchedLines: [{ lineNo: 1, reason: 'no_candidate' }], unmatchedMemos: ['m2', 'm1'] });
  });

  it('names the line or memo at fault', () => {
    expect(() => matchStatement([line(1, 1.5, '2025-01-01')], [], opts)).toThrow(ReconciliationInputError);
    expect(() => matchStatement([line(1, 1.5, '2025-01-01')], [], opts)).toThrow(/statement line 1: amountMinor/);
    expect(() => matchStatement([line(2, 1, '2025-13-01')], [], opts)).toThrow(/statement line 2: date "2025-13-01" is not a real date/);
    expect(() => matchStatement([line(2, 1, '2025-01-01'), line(2, 1, '2025-01-01')], [], opts)).toThrow(/lineNo is used twice/);
    expect(() => matchStatement([], [memo(1, 1, '2025-01-01', { currency: 'XXX' as never })], opts)).toThrow(/memo CM-2025-000001-3: currency "XXX"/);
    expect(() => matchStatement([], [], { dateWindowDays: -1 })).toThrow(/dateWindowDays/);
  });
});
