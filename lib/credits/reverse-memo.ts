import { negateMinor } from '@/lib/money';
import { assembleMemo, type UnnumberedLine } from './build-lines';
import { CreditInputError } from './credit-input-error';
import type { CreditMemoDraft } from './types';

/**
 * A reversal memo: one line per non-zero line of the issued memo, negating what that line posted
 * (adjustments included), so the two memos sum to exactly zero. A reversal is not itself reversed:
 * issue a fresh memo instead.
 */
export function reverseMemo(memo: CreditMemoDraft & { number: string }, reason: string): CreditMemoDraft {
  if (memo.kind === 'reversal') {
    throw new CreditInputError([{ path: 'memo', message: `${memo.number} is already a reversal; issue a new memo instead` }]);
  }
  if (reason.trim().length === 0) throw new CreditInputError([{ path: 'reason', message: 'say why the memo is reversed' }]);
  const lines: UnnumberedLine[] = memo.lines
    .filter((l) => l.amountMinor !== 0)
    .map((l) => {
      const { lineNo, adjustments: _adjustments, ...rest } = l;
      const amount = negateMinor(l.amountMinor);
      return { ...rest, computedMinor: amount, amountMinor: amount, adjustments: [], reversesLineNo: lineNo };
    });
  return assembleMemo('reversal', memo.currency, lines, {
    reversal: { reversesMemoNumber: memo.number, reason: reason.trim() },
  });
}
