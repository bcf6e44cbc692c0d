import { toDayNumber } from '@/lib/calendar';
import { isCurrencyCode, isMinorUnits } from '@/lib/money';
import { ReconciliationInputError } from './input-error';
import type { MemoForMatching, StatementLine } from './types';

/** Checks lines and memos, returning their day numbers; throws naming the line or memo at fault. */
export function checkLines(lines: readonly StatementLine[]): number[] {
  const seen = new Set<number>();
  return lines.map((l, i) => {
    const where = `statement line ${Number.isInteger(l.lineNo) ? l.lineNo : `at index ${i}`}`;
    if (!Number.isInteger(l.lineNo)) throw new ReconciliationInputError(`${where}: lineNo must be a whole number`);
    if (seen.has(l.lineNo)) throw new ReconciliationInputError(`${where}: lineNo is used twice`);
    seen.add(l.lineNo);
    if (!isMinorUnits(l.amountMinor)) throw new ReconciliationInputError(`${where}: amountMinor must be a whole number of minor units`);
    if (!isCurrencyCode(l.currency)) throw new ReconciliationInputError(`${where}: currency ${JSON.stringify(l.currency)} is not supported`);
    return dayOf(l.date, `${where}: date`);
  });
}

export function checkMemos(memos: readonly MemoForMatching[]): number[] {
  const seen = new Set<string>();
  return memos.map((m, i) => {
    const where = `memo ${m.number || m.id || `at index ${i}`}`;
    if (!m.id) throw new ReconciliationInputError(`${where}: id is required`);
    if (seen.has(m.id)) throw new ReconciliationInputError(`${where}: id ${m.id} is used twice`);
    seen.add(m.id);
    if (!m.dealerId) throw new ReconciliationInputError(`${where}: dealerId is required`);
    if (!isMinorUnits(m.totalMinor)) throw new ReconciliationInputError(`${where}: totalMinor must be a whole number of minor units`);
    if (!isCurrencyCode(m.currency)) throw new ReconciliationInputError(`${where}: currency ${JSON.stringify(m.currency)} is not supported`);
    return dayOf(m.issuedOn, `${where}: issuedOn`);
  });
}

function dayOf(date: string, what: string): number {
  try {
    return toDayNumber(date);
  } catch {
    throw new ReconciliationInputError(`${what} ${JSON.stringify(date)} is not a real date YYYY-MM-DD`);
  }
}
