import { toDecimalString, type CurrencyCode, type MinorUnits } from '@/lib/money';
import { CHARGEBACK_RULES } from './chargeback-reasons';
import type { CreditLine } from './types';

/** One sentence saying how a line's amount was reached, for the memo screen and the PDF. */
export function describeBasis(line: CreditLine, currency: CurrencyCode): string {
  const m = (v: MinorUnits) => `${toDecimalString(v, currency)} ${currency}`;
  const b = line.basis;
  let text: string;
  switch (b.kind) {
    case 'part_at_dealer_net':
      text = `${b.quantity} × ${m(b.unitPriceMinor)} dealer net (price list from ${b.priceListEffectiveFrom})`;
      if (b.quantity < b.requestedQuantity) text += `; ${b.quantity} of ${b.requestedQuantity} requested approved`;
      break;
    case 'part_shipped_by_brand':
      text = `${b.quantity} shipped by the brand under the RMA; a shipped part is not credited`;
      break;
    case 'part_not_approved':
      text = `${b.requestedQuantity} requested, none approved`;
      break;
    case 'labor': {
      const rate = b.capApplied
        ? `${m(b.rateAppliedMinor)}/h (brand maximum; dealer rate ${m(b.dealerRateMinor)}/h)`
        : `${m(b.rateAppliedMinor)}/h (dealer rate, within the brand maximum ${m(b.brandMaxRateMinor)}/h)`;
      const requested = b.requestedHours !== undefined && b.requestedHours !== b.approvedHours ? `, ${b.requestedHours} h requested` : '';
      text = `${b.approvedHours} h approved (schedule ${b.scheduledHours} h${requested}) × ${rate}`;
      if (b.withheldMinor !== undefined) {
        text += `; ${m(b.withheldMinor)} withheld until the after-test verifies the repair or the rep accepts it`;
      } else if (b.release.state === 'accepted_by_rep') {
        text += `; released by the rep: ${b.release.reason}`;
      }
      break;
    }
    case 'freight':
      text = `freight allowance as approved${b.requestedMinor !== undefined && b.requestedMinor !== b.approvedMinor ? ` (${m(b.requestedMinor)} requested)` : ''}`;
      break;
    case 'chargeback_part':
      text = `${CHARGEBACK_RULES[b.reason].label}: ${b.quantity} × ${m(b.unitPriceMinor)} dealer net (price list from ${b.priceListEffectiveFrom})`;
      break;
    case 'chargeback_labor':
      text = `${CHARGEBACK_RULES[b.reason].label}: labor credited on this claim${b.creditedOnMemos.length ? ` (${b.creditedOnMemos.join(', ')})` : ''} taken back`;
      break;
  }
  const last = line.adjustments[line.adjustments.length - 1];
  if (last) text += `; edited from ${m(line.computedMinor)} to ${m(last.toMinor)}: ${last.reason}`;
  if (line.reversesLineNo !== undefined) text = `reverses line ${line.reversesLineNo}: ${text}`;
  return text;
}
