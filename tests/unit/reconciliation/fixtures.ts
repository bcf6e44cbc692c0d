import { formatClaimNumber, formatCreditMemoNumber, formatRmaNumber } from '@/lib/credits';
import type { MemoForMatching, StatementLine } from '@/lib/reconciliation';

// Invented demo scenario: dealers D-NORTH and D-SOUTH, memos in USD unless said otherwise.
export function memo(seq: number, totalMinor: number, issuedOn: string, over: Partial<MemoForMatching> = {}): MemoForMatching {
  return {
    id: `m${seq}`,
    number: formatCreditMemoNumber({ year: 2025, sequence: seq }),
    claimNumber: formatClaimNumber({ year: 2025, sequence: 500 + seq }),
    rmaNumber: formatRmaNumber({ year: 2025, sequence: 900 + seq }),
    dealerId: 'D-NORTH',
    currency: 'USD',
    totalMinor,
    issuedOn,
    ...over,
  };
}

export function line(lineNo: number, amountMinor: number, date: string, over: Partial<StatementLine> = {}): StatementLine {
  return { lineNo, amountMinor, date, currency: 'USD', dealerId: 'D-NORTH', ...over };
}
