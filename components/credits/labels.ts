// Our wording for the money end of a claim, shared by server pages and client tables.
import type { CreditLineStatus, CreditMemoKind } from '@/lib/credits';
import { formatMoney, type CurrencyCode } from '@/lib/money';

export const LINE_STATUS_LABELS: Record<CreditLineStatus, string> = {
  credited: 'Credited',
  withheld: 'Withheld',
  not_credited: 'Not credited',
  charged_back: 'Charged back',
};

export const LINE_KIND_LABELS: Record<string, string> = { part: 'Part', labor: 'Labor', freight: 'Freight', chargeback: 'Chargeback' };

export const MEMO_KIND_LABELS: Record<CreditMemoKind, string> = {
  claim: 'Credit memo',
  chargeback: 'Chargeback memo',
  reversal: 'Reversing memo',
};

export const AFTER_TEST_LABELS: Record<string, string> = {
  passed: 'After-test passed',
  accepted_by_hand: 'Accepted by the rep',
  failed: 'After-test failed',
  none: 'No after-test yet',
};

export function coreLabel(outcome: string, inspection: string | null): string {
  if (outcome === 'inspected') {
    return inspection === 'no_fault_found' ? 'No fault found' : inspection === 'not_covered' ? 'Not covered' : 'Fault confirmed';
  }
  return { waived: 'Return waived', written_off: 'Not returned', open: 'Still open' }[outcome] ?? outcome;
}

export const CHARGEBACK_REASON_OPTIONS = [
  { value: 'not_covered_at_inspection', label: 'Damage not covered, found after the credit' },
  { value: 'no_fault_found', label: 'No fault found on the returned part' },
  { value: 'core_not_returned', label: 'Core not returned in time' },
];

/** Amounts in accounting form: parentheses for what the dealer owes. */
export function money(minor: number, currency: string): string {
  return formatMoney(minor, currency as CurrencyCode, { accounting: true });
}
