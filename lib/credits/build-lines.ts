import {
  exactProductText,
  multiplyMinorByDecimal,
  multiplyMinorByInteger,
  negateMinor,
  parseExactDecimal,
  sumMinor,
  type CurrencyCode,
  type ExactDecimal,
  type MinorUnits,
} from '@/lib/money';
import { CHARGEBACK_RULES } from './chargeback-reasons';
import { findPriceOn } from './price-list';
import type {
  ApprovedPart,
  ChargebackRequest,
  CreditLine,
  CreditMemoDraft,
  CreditMemoKind,
  FreightAllowance,
  LaborOperation,
  LaborRates,
  LaborRelease,
  PriceListEntry,
} from './types';

/** A line before it is numbered in its memo. */
export type UnnumberedLine = Omit<CreditLine, 'lineNo'>;

interface Pricing {
  priceDate: string;
  priceList: PriceListEntry[];
}

function priceOf(pricing: Pricing, partNumber: string): PriceListEntry {
  const entry = findPriceOn(pricing.priceList, partNumber, pricing.priceDate);
  // Validation guarantees the entry; reaching this is a programming error, not bad input.
  if (!entry) throw new Error(`no price for ${partNumber} on ${pricing.priceDate}`);
  return entry;
}

function line(fields: Omit<UnnumberedLine, 'amountMinor' | 'adjustments'>): UnnumberedLine {
  return { ...fields, amountMinor: fields.computedMinor, adjustments: [] };
}

export function partLine(part: ApprovedPart, pricing: Pricing): UnnumberedLine {
  const common = { kind: 'part' as const, partNumber: part.partNumber, category: part.category };
  if (part.approvedQuantity === 0) {
    return line({
      ...common,
      status: 'not_credited',
      description: `${part.description} — not approved`,
      computedMinor: 0,
      basis: { kind: 'part_not_approved', partNumber: part.partNumber, requestedQuantity: part.requestedQuantity },
    });
  }
  if (part.source === 'brand_shipped') {
    return line({
      ...common,
      status: 'not_credited',
      description: `${part.description} — shipped by the brand, no part credit`,
      computedMinor: 0,
      basis: {
        kind: 'part_shipped_by_brand',
        partNumber: part.partNumber,
        quantity: part.approvedQuantity,
        requestedQuantity: part.requestedQuantity,
      },
    });
  }
  const price = priceOf(pricing, part.partNumber);
  return line({
    ...common,
    status: 'credited',
    description: `${part.description} — fitted from dealer stock`,
    computedMinor: multiplyMinorByInteger(price.dealerNetMinor, part.approvedQuantity, `part ${part.partNumber}`),
    basis: {
      kind: 'part_at_dealer_net',
      partNumber: part.partNumber,
      quantity: part.approvedQuantity,
      requestedQuantity: part.requestedQuantity,
      unitPriceMinor: price.dealerNetMinor,
      priceListEffectiveFrom: price.effectiveFrom,
    },
  });
}

function hoursOf(text: string): ExactDecimal {
  const p = parseExactDecimal(text);
  if (!p.ok) throw new Error(p.message);
  return p.value;
}

export function laborLine(op: LaborOperation, rates: LaborRates, release: LaborRelease): UnnumberedLine {
  const capApplied = rates.dealerRateMinor > rates.brandMaxRateMinor;
  const rate = capApplied ? rates.brandMaxRateMinor : rates.dealerRateMinor;
  const h = hoursOf(op.approvedHours);
  const amount = multiplyMinorByDecimal(rate, h, `labor ${op.code}`);
  const released = release.state !== 'not_verified';
  const approved = h.units > 0n;
  const status = !approved ? 'not_credited' : released ? 'credited' : 'withheld';
  const suffix = !approved ? ' — not approved' : released ? '' : ' — withheld until the repair is verified';
  return line({
    kind: 'labor',
    laborCode: op.code,
    status,
    description: `${op.description}${suffix}`,
    computedMinor: status === 'credited' ? amount : 0,
    basis: {
      kind: 'labor',
      operationCode: op.code,
      approvedHours: op.approvedHours,
      scheduledHours: op.scheduledHours,
      ...(op.requestedHours === undefined ? {} : { requestedHours: op.requestedHours }),
      dealerRateMinor: rates.dealerRateMinor,
      brandMaxRateMinor: rates.brandMaxRateMinor,
      rateAppliedMinor: rate,
      capApplied,
      exactMinor: exactProductText(rate, h),
      release,
      ...(status === 'withheld' ? { withheldMinor: amount } : {}),
    },
  });
}

export function freightLine(freight: FreightAllowance): UnnumberedLine {
  return line({
    kind: 'freight',
    status: freight.approvedMinor > 0 ? 'credited' : 'not_credited',
    description: freight.description?.trim() || 'Freight allowance',
    computedMinor: freight.approvedMinor,
    basis: {
      kind: 'freight',
      approvedMinor: freight.approvedMinor,
      ...(freight.requestedMinor === undefined ? {} : { requestedMinor: freight.requestedMinor }),
    },
  });
}

/**
 * Chargeback basis (ours, documented in README.md):
 * - part: −(dealer net price on the price date × quantity) for each part charged back, whether
 *   the brand shipped it or the dealer was credited for fitting it from stock;
 * - labor: −(all labor credited on the claim) when the reason takes labor back;
 * - freight is never charged back.
 */
export function chargebackLines(
  cb: ChargebackRequest,
  parts: readonly ApprovedPart[],
  pricing: Pricing,
  labor: { creditedMinor: MinorUnits; creditedOnMemos: string[] },
): UnnumberedLine[] {
  const rule = CHARGEBACK_RULES[cb.reason];
  const note = cb.note?.trim() ? { note: cb.note.trim() } : {};
  const targets =
    cb.parts ??
    parts.filter((p) => p.approvedQuantity > 0).map((p) => ({ partNumber: p.partNumber, quantity: p.approvedQuantity }));
  const out: UnnumberedLine[] = targets.map((t) => {
    const part = parts.find((p) => p.partNumber === t.partNumber);
    if (!part) throw new Error(`chargeback part ${t.partNumber} is not on the claim`);
    const price = priceOf(pricing, t.partNumber);
    return line({
      kind: 'chargeback',
      status: 'charged_back',
      partNumber: part.partNumber,
      category: part.category,
      description: `${rule.label} — ${part.description}`,
      computedMinor: negateMinor(multiplyMinorByInteger(price.dealerNetMinor, t.quantity, `chargeback ${t.partNumber}`)),
      basis: {
        kind: 'chargeback_part',
        reason: cb.reason,
        partNumber: part.partNumber,
        quantity: t.quantity,
        source: part.source,
        unitPriceMinor: price.dealerNetMinor,
        priceListEffectiveFrom: price.effectiveFrom,
        ...note,
      },
    });
  });
  if (rule.takesBackLabor && labor.creditedMinor > 0) {
    out.push(
      line({
        kind: 'chargeback',
        status: 'charged_back',
        description: `${rule.label} — labor credited`,
        computedMinor: negateMinor(labor.creditedMinor),
        basis: {
          kind: 'chargeback_labor',
          reason: cb.reason,
          laborCreditedMinor: labor.creditedMinor,
          creditedOnMemos: labor.creditedOnMemos,
          ...note,
        },
      }),
    );
  }
  return out;
}

/** Numbers the lines 1…n and totals them: the total is the sum of the already-rounded lines. */
export function assembleMemo(
  kind: CreditMemoKind,
  currency: CurrencyCode,
  lines: readonly UnnumberedLine[],
  extra: Pick<CreditMemoDraft, 'reversal'> = {},
): CreditMemoDraft {
  const numbered = lines.map((l, i) => ({ ...l, lineNo: i + 1 }) as CreditLine);
  return { kind, currency, lines: numbered, totalMinor: memoTotal(numbered), ...extra };
}

export function memoTotal(lines: readonly Pick<CreditLine, 'amountMinor'>[]): MinorUnits {
  return sumMinor(lines.map((l) => l.amountMinor));
}
