import { addMinor, isMinorUnits, negateMinor, type MinorUnits } from '@/lib/money';
import { memoTotal } from './build-lines';
import { CreditInputError, type CreditInputIssue } from './credit-input-error';
import type { CreditMemoDraft } from './types';

export interface LineEdit {
  lineNo: number;
  /** The amount the line should post instead. */
  amountMinor: MinorUnits;
  reason: string;
  /** Who edited (user id or name). */
  by: string;
  /** When (ISO timestamp). */
  at: string;
}

/**
 * An accountant's edit of one line. The computed value stays on the line; the edit is appended to
 * its adjustments with the delta against that computed value, and the total is recomputed.
 * Refused: withheld labor (released only by a verified repair or the rep's acceptance), lines of a
 * reversal memo, a credit line made negative or a chargeback made positive, and an edit without a reason.
 */
export function adjustLine(memo: CreditMemoDraft, edit: LineEdit): CreditMemoDraft {
  const issues: CreditInputIssue[] = [];
  const target = memo.lines.find((l) => l.lineNo === edit.lineNo);
  if (memo.kind === 'reversal') issues.push({ path: 'memo', message: 'a reversal memo is not edited; reverse it or issue a new memo' });
  if (!target) issues.push({ path: 'lineNo', message: `the memo has no line ${edit.lineNo}` });
  if (!isMinorUnits(edit.amountMinor)) issues.push({ path: 'amountMinor', message: 'must be a whole number of minor units' });
  if (edit.reason.trim().length === 0) issues.push({ path: 'reason', message: 'say why the line is changed' });
  if (edit.by.trim().length === 0) issues.push({ path: 'by', message: 'is required' });
  if (edit.at.trim().length === 0) issues.push({ path: 'at', message: 'is required' });
  if (target) {
    if (target.status === 'withheld') {
      issues.push({
        path: 'lineNo',
        message: `line ${target.lineNo} is labor withheld until the repair is verified; it is released by the after-test or the rep's acceptance, not by an edit`,
      });
    } else if (target.kind === 'chargeback' && edit.amountMinor > 0) {
      issues.push({ path: 'amountMinor', message: `line ${target.lineNo} is a chargeback and cannot become a credit` });
    } else if (target.kind !== 'chargeback' && edit.amountMinor < 0) {
      issues.push({ path: 'amountMinor', message: `line ${target.lineNo} is a credit and cannot become negative; add a chargeback instead` });
    }
  }
  if (issues.length > 0 || !target) throw new CreditInputError(issues);

  const lines = memo.lines.map((l) =>
    l.lineNo !== edit.lineNo
      ? l
      : {
          ...l,
          amountMinor: edit.amountMinor,
          adjustments: [
            ...l.adjustments,
            {
              fromMinor: l.amountMinor,
              toMinor: edit.amountMinor,
              deltaMinor: addMinor(edit.amountMinor, negateMinor(l.computedMinor)),
              reason: edit.reason.trim(),
              by: edit.by,
              at: edit.at,
            },
          ],
        },
  );
  return { ...memo, lines, totalMinor: memoTotal(lines) };
}
