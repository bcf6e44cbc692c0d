import type { CreditLine } from '@/lib/credits';

// The row shape of a memo line, shared by the data layer and the demo scenario's loader (which
// runs outside the server bundle and so cannot import the server-only modules).

/** A memo line as stored: the line itself plus quantity, unit and unit amount read from its basis. */
export function memoLineRow(memoId: string, l: CreditLine) {
  const b = l.basis;
  const quantity = b.kind === 'labor' ? b.approvedHours : 'quantity' in b ? String(b.quantity) : null;
  const unit = b.kind === 'labor' ? 'hour' : 'quantity' in b ? 'each' : null;
  const unitAmount = b.kind === 'labor' ? b.rateAppliedMinor : 'unitPriceMinor' in b ? b.unitPriceMinor : null;
  return {
    memo_id: memoId, line_no: l.lineNo, kind: l.kind, status: l.status, description: l.description,
    part_number: l.partNumber ?? null, category: l.category ?? null, labor_code: l.laborCode ?? null,
    quantity, unit, unit_amount_minor: unitAmount, computed_minor: l.computedMinor, amount_minor: l.amountMinor,
    basis: JSON.stringify(b), adjustments: JSON.stringify(l.adjustments), reverses_line_no: l.reversesLineNo ?? null,
  };
}
