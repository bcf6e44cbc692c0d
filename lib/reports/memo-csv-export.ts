import type { IsoDate } from '@/lib/calendar';
import type { CreditMemoDraft } from '@/lib/credits';
import { sumMinor, toDecimalString } from '@/lib/money';
import { csvRecord, defuseFormula } from './csv-write';
import { ReportInputError } from './report-input-error';

/** An issued memo with the identifiers the accounting system posts against. */
export interface MemoForExport extends CreditMemoDraft {
  number: string;
  issuedOn: IsoDate;
  dealerId: string;
  /** The dealer's account number with the brand. */
  dealerAccount: string;
  claimNumber: string;
  rmaNumber?: string | null;
}

/** Our export layout, version 1. The README documents each column. */
export const MEMO_EXPORT_COLUMNS = [
  'layout',
  'memo_number',
  'memo_kind',
  'memo_date',
  'reverses_memo',
  'dealer_id',
  'dealer_account',
  'claim_number',
  'rma_number',
  'currency',
  'line_no',
  'line_kind',
  'line_status',
  'chargeback_reason',
  'part_number',
  'part_category',
  'labor_code',
  'quantity',
  'hours',
  'unit_amount',
  'computed_amount',
  'line_amount',
  'adjustment_reason',
  'description',
  'memo_total',
] as const;

export const MEMO_EXPORT_LAYOUT = 'LP-MEMO-LINES-1';

/**
 * One CSV row per memo line, header first: amounts as plain decimals with a dot and the
 * currency's decimals ("-12.30", "1200" for JPY), dates YYYY-MM-DD, RFC 4180 quoting, CRLF.
 * Refuses a memo without lines or whose total is not the sum of its lines.
 */
export function exportMemosCsv(memos: readonly MemoForExport[]): string {
  let out = csvRecord(MEMO_EXPORT_COLUMNS);
  for (const memo of memos) {
    if (memo.lines.length === 0) throw new ReportInputError(`memo ${memo.number}: has no lines to export`);
    const sum = sumMinor(memo.lines.map((l) => l.amountMinor));
    if (sum !== memo.totalMinor) {
      throw new ReportInputError(`memo ${memo.number}: total ${memo.totalMinor} is not the sum of its lines (${sum})`);
    }
    const money = (v: number) => toDecimalString(v, memo.currency);
    for (const line of memo.lines) {
      const b = line.basis;
      const quantity = 'quantity' in b ? String(b.quantity) : '';
      const hours = b.kind === 'labor' ? b.approvedHours : '';
      const unit =
        b.kind === 'labor' ? money(b.rateAppliedMinor) : 'unitPriceMinor' in b ? money(b.unitPriceMinor) : '';
      const reason = b.kind === 'chargeback_part' || b.kind === 'chargeback_labor' ? b.reason : '';
      const lastEdit = line.adjustments[line.adjustments.length - 1];
      const row: Record<(typeof MEMO_EXPORT_COLUMNS)[number], string> = {
        layout: MEMO_EXPORT_LAYOUT,
        memo_number: memo.number,
        memo_kind: memo.kind,
        memo_date: memo.issuedOn,
        reverses_memo: memo.reversal?.reversesMemoNumber ?? '',
        dealer_id: memo.dealerId,
        dealer_account: memo.dealerAccount,
        claim_number: memo.claimNumber,
        rma_number: memo.rmaNumber ?? '',
        currency: memo.currency,
        line_no: String(line.lineNo),
        line_kind: line.kind,
        line_status: line.status,
        chargeback_reason: reason,
        part_number: line.partNumber ?? '',
        part_category: line.category ?? '',
        labor_code: line.laborCode ?? '',
        quantity,
        hours,
        unit_amount: unit,
        computed_amount: money(line.computedMinor),
        line_amount: money(line.amountMinor),
        adjustment_reason: defuseFormula(lastEdit?.reason ?? ''),
        description: defuseFormula(line.description),
        memo_total: money(memo.totalMinor),
      };
      out += csvRecord(MEMO_EXPORT_COLUMNS.map((c) => row[c]));
    }
  }
  return out;
}
