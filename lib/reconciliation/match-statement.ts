import { addMinor, negateMinor } from '@/lib/money';
import { ReconciliationInputError } from './input-error';
import { ReferenceIndex, type ReferenceHit } from './reference-index';
import { checkLines, checkMemos } from './validate-input';
import type {
  AmbiguousLine,
  Candidate,
  MatchOptions,
  MatchResult,
  MemoForMatching,
  ProposedMatch,
  ReferenceField,
  StatementLine,
  UnmatchedLine,
} from './types';

interface Memo extends MemoForMatching {
  day: number;
}
interface Line extends StatementLine {
  day: number;
  dealer: string | undefined;
}

/**
 * Proposes which statement line settles which credit memo. Nothing is decided: the accountant
 * confirms. Rules, in order:
 *
 * 1. Reference: the line's reference contains a memo number (decisive), else a claim or RMA number
 *    (normalised: case, spaces, dashes). Several memos → those of the line's exact amount; one left
 *    → proposed, else ambiguous. Memos of another dealer or currency are refused, never proposed.
 *    Two lines naming the same memo → both ambiguous.
 * 2. Amount and date: lines with no reference hit, against memos not already taken or named by a
 *    reference: same dealer, same currency, exactly the same amount, issued within ± dateWindowDays.
 *    Proposed only when the pairing is unique both ways; otherwise ambiguous.
 *
 * Memos are grouped by (dealer, currency, amount) and sorted by date, so each line costs a hash
 * lookup and two binary searches: O((n + m) log m) overall.
 */
export function matchStatement(
  statementLines: readonly StatementLine[],
  creditMemos: readonly MemoForMatching[],
  options: MatchOptions,
): MatchResult {
  const window = options.dateWindowDays;
  if (!Number.isInteger(window) || window < 0) {
    throw new ReconciliationInputError(`dateWindowDays: ${window} must be a whole number of days, 0 or more`);
  }
  const listLimit = options.maxCandidatesListed ?? 10;
  const lineDays = checkLines(statementLines);
  const memoDays = checkMemos(creditMemos);
  const lines: Line[] = statementLines.map((l, i) => {
    if (l.dealerId && options.statementDealerId && l.dealerId !== options.statementDealerId) {
      throw new ReconciliationInputError(
        `statement line ${l.lineNo}: dealer ${l.dealerId} differs from the statement's dealer ${options.statementDealerId}`,
      );
    }
    return { ...l, day: lineDays[i] as number, dealer: l.dealerId ?? options.statementDealerId };
  });
  const memos: Memo[] = creditMemos.map((m, i) => ({ ...m, day: memoDays[i] as number }));
  const memoById = new Map(memos.map((m) => [m.id, m]));

  const matches: ProposedMatch[] = [];
  const ambiguous: AmbiguousLine[] = [];
  const unmatchedLines: UnmatchedLine[] = [];
  const taken = new Set<string>(); // matched or named by an ambiguous reference
  const candidate = (m: Memo, line: Line, field?: ReferenceField): Candidate => ({
    memoId: m.id,
    memoNumber: m.number,
    ...(field ? { referenceField: field } : {}),
    daysApart: line.day - m.day,
  });

  // 1. Reference.
  const index = new ReferenceIndex(memos);
  const byReference = new Map<string, { line: Line; field: ReferenceField }[]>();
  const needAmount: Line[] = [];
  for (const line of lines) {
    const hits = line.reference ? index.find(line.reference) : [];
    if (hits.length === 0) {
      needAmount.push(line);
      continue;
    }
    const eligible = hits.filter((h) => h.memo.currency === line.currency && (!line.dealer || h.memo.dealerId === line.dealer));
    if (eligible.length === 0) {
      const otherDealer = hits.some((h) => line.dealer && h.memo.dealerId !== line.dealer);
      unmatchedLines.push({ lineNo: line.lineNo, reason: otherDealer ? 'reference_other_dealer' : 'reference_other_currency' });
      continue;
    }
    const byNumber = eligible.filter((h) => h.field === 'memo_number');
    const chosen = distinctMemos(byNumber.length > 0 ? byNumber : eligible);
    let pick = chosen;
    if (chosen.length > 1) {
      const sameAmount = chosen.filter((h) => h.memo.totalMinor === line.amountMinor);
      if (sameAmount.length > 0) pick = sameAmount;
    }
    const only = pick.length === 1 ? pick[0] : undefined;
    if (only) {
      const claims = byReference.get(only.memo.id);
      if (claims) claims.push({ line, field: only.field });
      else byReference.set(only.memo.id, [{ line, field: only.field }]);
    } else {
      for (const h of pick) taken.add(h.memo.id);
      ambiguous.push({
        lineNo: line.lineNo,
        basis: 'reference',
        reason: 'several_memos',
        candidates: pick.slice(0, listLimit).map((h) => candidate(h.memo, line, h.field)),
        candidateCount: pick.length,
      });
    }
  }
  for (const [memoId, claims] of byReference) {
    const memo = memoById.get(memoId) as Memo;
    taken.add(memoId);
    const [first] = claims;
    if (first && claims.length === 1) {
      matches.push({
        lineNo: first.line.lineNo,
        memoId,
        basis: 'reference',
        referenceField: first.field,
        amountDifferenceMinor: addMinor(first.line.amountMinor, negateMinor(memo.totalMinor)),
        daysApart: first.line.day - memo.day,
      });
    } else {
      for (const c of claims) {
        ambiguous.push({
          lineNo: c.line.lineNo,
          basis: 'reference',
          reason: 'memo_wanted_by_several_lines',
          candidates: [candidate(memo, c.line, c.field)],
          candidateCount: 1,
        });
      }
    }
  }

  // 2. Amount within the date window, same dealer and currency.
  const groupKey = (dealer: string, currency: string, amount: number) => `${dealer}\u0000${currency}\u0000${amount}`;
  const memoGroups = groupSorted(memos.filter((m) => !taken.has(m.id)), (m) => groupKey(m.dealerId, m.currency, m.totalMinor));
  const lineGroups = groupSorted(
    needAmount.filter((l) => l.dealer !== undefined),
    (l) => groupKey(l.dealer as string, l.currency, l.amountMinor),
  );
  for (const line of needAmount) {
    if (line.dealer === undefined) {
      unmatchedLines.push({ lineNo: line.lineNo, reason: 'no_dealer' });
      continue;
    }
    const key = groupKey(line.dealer, line.currency, line.amountMinor);
    const group = memoGroups.get(key);
    const lo = group ? lowerBound(group.days, line.day - window) : 0;
    const hi = group ? upperBound(group.days, line.day + window) : 0;
    if (!group || hi === lo) {
      unmatchedLines.push({ lineNo: line.lineNo, reason: 'no_candidate' });
      continue;
    }
    const fits = group.items.slice(lo, Math.min(hi, lo + listLimit)).map((m) => candidate(m, line));
    if (hi - lo > 1) {
      ambiguous.push({ lineNo: line.lineNo, basis: 'amount_date', reason: 'several_memos', candidates: fits, candidateCount: hi - lo });
      continue;
    }
    const memo = group.items[lo] as Memo;
    const rivals = lineGroups.get(key) as { days: number[] };
    const wanting = upperBound(rivals.days, memo.day + window) - lowerBound(rivals.days, memo.day - window);
    if (wanting > 1) {
      ambiguous.push({ lineNo: line.lineNo, basis: 'amount_date', reason: 'memo_wanted_by_several_lines', candidates: fits, candidateCount: 1 });
      continue;
    }
    taken.add(memo.id);
    matches.push({ lineNo: line.lineNo, memoId: memo.id, basis: 'amount_date', amountDifferenceMinor: 0, daysApart: line.day - memo.day });
  }

  const matched = new Set(matches.map((m) => m.memoId));
  const unmatchedMemos = memos
    .filter((m) => !matched.has(m.id))
    .sort((a, b) => a.day - b.day || (a.number < b.number ? -1 : a.number > b.number ? 1 : 0))
    .map((m) => m.id);
  const byLine = <T extends { lineNo: number }>(a: T, b: T) => a.lineNo - b.lineNo;
  return {
    matches: matches.sort(byLine),
    ambiguous: ambiguous.sort(byLine),
    unmatchedMemos,
    unmatchedLines: unmatchedLines.sort(byLine),
  };
}

function distinctMemos<M extends MemoForMatching>(hits: ReferenceHit<M>[]): ReferenceHit<M>[] {
  const seen = new Map<string, ReferenceHit<M>>();
  for (const h of hits) if (!seen.has(h.memo.id)) seen.set(h.memo.id, h);
  return [...seen.values()];
}

function groupSorted<T extends { day: number }>(items: readonly T[], key: (t: T) => string): Map<string, { items: T[]; days: number[] }> {
  const groups = new Map<string, { items: T[]; days: number[] }>();
  for (const item of items) {
    const k = key(item);
    const g = groups.get(k);
    if (g) g.items.push(item);
    else groups.set(k, { items: [item], days: [] });
  }
  for (const g of groups.values()) {
    g.items.sort((a, b) => a.day - b.day);
    g.days = g.items.map((i) => i.day);
  }
  return groups;
}

/** First index with days[i] ≥ x. */
function lowerBound(days: readonly number[], x: number): number {
  let lo = 0;
  let hi = days.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((days[mid] as number) < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index with days[i] > x. */
function upperBound(days: readonly number[], x: number): number {
  let lo = 0;
  let hi = days.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((days[mid] as number) <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
