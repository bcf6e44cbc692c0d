import { addMinor, sumMinor } from '@/lib/money';
import { assembleMemo, chargebackLines, freightLine, laborLine, partLine } from './build-lines';
import { validateChargebackInput, validateCreditInput } from './credit-input-schema';
import type { ChargebackInput, CreditInput, CreditMemoDraft } from './types';

/**
 * The credit memo for an approved claim: parts fitted from dealer stock at dealer net, labor at
 * approved hours × min(dealer rate, brand maximum) — withheld (amount 0) until the repair is
 * verified — the freight allowance, and any chargeback known at issue. Each line is rounded once;
 * the total is the sum of the lines. Throws CreditInputError naming each bad field.
 */
export function computeCredit(input: CreditInput): CreditMemoDraft {
  validateCreditInput(input);
  const lines = [
    ...input.parts.map((p) => partLine(p, input)),
    ...input.labor.map((op) => laborLine(op, input.laborRates, input.laborRelease)),
    ...(input.freight ? [freightLine(input.freight)] : []),
  ];
  if (input.chargeback) {
    const laborHere = sumMinor(lines.filter((l) => l.kind === 'labor').map((l) => l.amountMinor));
    lines.push(
      ...chargebackLines(input.chargeback, input.parts, input, {
        creditedMinor: addMinor(laborHere, input.priorLaborCreditedMinor ?? 0),
        creditedOnMemos: [],
      }),
    );
  }
  return assembleMemo('claim', input.currency, lines);
}

/** A chargeback memo for a claim already credited (e.g. the part was later found not covered). */
export function computeChargebackMemo(input: ChargebackInput): CreditMemoDraft {
  validateChargebackInput(input);
  const lines = chargebackLines(input.chargeback, input.parts, input, {
    creditedMinor: input.laborCreditedMinor,
    creditedOnMemos: input.creditedOnMemos ?? [],
  });
  return assembleMemo('chargeback', input.currency, lines);
}
