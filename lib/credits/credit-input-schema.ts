import { z } from 'zod';
import { isIsoDate } from '@/lib/calendar';
import { CURRENCY_CODES, compareDecimal, parseExactDecimal, type CurrencyCode } from '@/lib/money';
import { CreditInputError, formatPath, type CreditInputIssue } from './credit-input-error';
import { findPriceOn } from './price-list';
import type { ApprovedPart, ChargebackInput, ChargebackRequest, CreditInput, PriceListEntry } from './types';

const text = z.string().trim().min(1, 'is required');
const minor = z.number().refine(Number.isSafeInteger, 'must be a whole number of minor units');
const nonNegativeMinor = minor.refine((v) => v >= 0, 'must not be negative');
const isoDate = z.string().refine(isIsoDate, 'must be a real date written YYYY-MM-DD');
const count = z.number().int('must be a whole number').nonnegative('must not be negative');
const hours = z.string().refine((s) => {
  const p = parseExactDecimal(s);
  return p.ok && p.value.units >= 0n;
}, 'must be hours written as a decimal with a dot, like "1.25", not negative');

const partSchema = z.object({
  partNumber: text,
  description: text,
  category: text,
  requestedQuantity: count.min(1, 'must be at least 1'),
  approvedQuantity: count,
  source: z.enum(['dealer_stock', 'brand_shipped']),
});

const priceListEntrySchema = z.object({ partNumber: text, dealerNetMinor: nonNegativeMinor, effectiveFrom: isoDate });

const chargebackSchema = z.object({
  reason: z.enum(['no_fault_found', 'core_not_returned', 'not_covered_at_inspection']),
  parts: z.array(z.object({ partNumber: text, quantity: count.min(1, 'must be at least 1') })).optional(),
  note: z.string().optional(),
});

const base = {
  currency: z.enum(CURRENCY_CODES as [CurrencyCode, ...CurrencyCode[]], {
    error: `must be a supported ISO 4217 code (${CURRENCY_CODES.join(', ')})`,
  }),
  priceDate: isoDate,
  priceList: z.array(priceListEntrySchema),
  parts: z.array(partSchema),
};

export const creditInputSchema = z
  .object({
    ...base,
    labor: z.array(
      z.object({
        code: text,
        description: text,
        scheduledHours: hours,
        requestedHours: hours.optional(),
        approvedHours: hours,
      }),
    ),
    laborRates: z.object({ dealerRateMinor: nonNegativeMinor, brandMaxRateMinor: nonNegativeMinor }),
    laborRelease: z.discriminatedUnion('state', [
      z.object({ state: z.literal('verified_by_test') }),
      z.object({ state: z.literal('accepted_by_rep'), reason: text }),
      z.object({ state: z.literal('not_verified'), reason: z.string().optional() }),
    ]),
    freight: z
      .object({ approvedMinor: nonNegativeMinor, requestedMinor: nonNegativeMinor.optional(), description: z.string().optional() })
      .optional(),
    chargeback: chargebackSchema.optional(),
    priorLaborCreditedMinor: nonNegativeMinor.optional(),
  })
  .superRefine((input, ctx) => {
    const add = (path: PropertyKey[], message: string) => ctx.addIssue({ code: 'custom', path, message });
    checkParts(input, add);
    input.labor.forEach((op, i) => {
      const approved = parseExactDecimal(op.approvedHours);
      const requested = op.requestedHours === undefined ? undefined : parseExactDecimal(op.requestedHours);
      if (approved.ok && requested?.ok && compareDecimal(approved.value, requested.value) > 0) {
        add(['labor', i, 'approvedHours'], `${op.approvedHours} h is more than the ${op.requestedHours} h requested`);
      }
    });
    if (input.freight?.requestedMinor !== undefined && input.freight.approvedMinor > input.freight.requestedMinor) {
      add(['freight', 'approvedMinor'], 'is more than the freight requested');
    }
    if (input.chargeback) checkChargeback(input.chargeback, input, add);
  });

export const chargebackInputSchema = z
  .object({
    ...base,
    chargeback: chargebackSchema,
    laborCreditedMinor: nonNegativeMinor,
    creditedOnMemos: z.array(text).optional(),
  })
  .superRefine((input, ctx) => {
    const add = (path: PropertyKey[], message: string) => ctx.addIssue({ code: 'custom', path, message });
    checkParts(input, add);
    checkChargeback(input.chargeback, input, add);
  });

type Add = (path: PropertyKey[], message: string) => void;
interface Priced {
  priceDate: string;
  priceList: PriceListEntry[];
  parts: ApprovedPart[];
}

function checkParts(input: Priced, add: Add): void {
  const seen = new Map<string, number>();
  input.parts.forEach((p, i) => {
    const first = seen.get(p.partNumber);
    if (first !== undefined) add(['parts', i, 'partNumber'], `${p.partNumber} is already listed as parts[${first}]`);
    else seen.set(p.partNumber, i);
    if (p.approvedQuantity > p.requestedQuantity) {
      add(['parts', i, 'approvedQuantity'], `${p.approvedQuantity} is more than the ${p.requestedQuantity} requested`);
    }
    if (p.source === 'dealer_stock' && p.approvedQuantity > 0) requirePrice(input, p.partNumber, ['parts', i, 'partNumber'], add);
  });
  const versions = new Map<string, number>();
  input.priceList.forEach((e, j) => {
    const key = `${e.partNumber}|${e.effectiveFrom}`;
    const first = versions.get(key);
    if (first !== undefined) {
      add(['priceList', j], `${e.partNumber} already has a price from ${e.effectiveFrom} (priceList[${first}])`);
    } else versions.set(key, j);
  });
}

function requirePrice(input: Priced, partNumber: string, path: PropertyKey[], add: Add): void {
  if (!isIsoDate(input.priceDate)) return;
  if (!findPriceOn(input.priceList, partNumber, input.priceDate)) {
    add(path, `no dealer net price for ${partNumber} in the price list in force on ${input.priceDate}`);
  }
}

function checkChargeback(cb: ChargebackRequest, input: Priced, add: Add): void {
  if (!cb.parts) {
    input.parts.forEach((p, i) => {
      if (p.approvedQuantity > 0 && p.source === 'brand_shipped') requirePrice(input, p.partNumber, ['parts', i, 'partNumber'], add);
    });
    return;
  }
  const seen = new Set<string>();
  cb.parts.forEach((c, i) => {
    const path = ['chargeback', 'parts', i];
    if (seen.has(c.partNumber)) add([...path, 'partNumber'], `${c.partNumber} is listed twice`);
    seen.add(c.partNumber);
    const part = input.parts.find((p) => p.partNumber === c.partNumber);
    if (!part) return add([...path, 'partNumber'], `${c.partNumber} is not one of this claim's parts`);
    if (c.quantity > part.approvedQuantity) {
      add([...path, 'quantity'], `${c.quantity} is more than the ${part.approvedQuantity} approved for ${c.partNumber}`);
    }
    requirePrice(input, c.partNumber, [...path, 'partNumber'], add);
  });
}

function toIssues(error: z.ZodError): CreditInputIssue[] {
  return error.issues.map((i) => ({ path: formatPath(i.path), message: i.message }));
}

/** Throws CreditInputError listing every problem, each with its field path. */
export function validateCreditInput(input: CreditInput): void {
  const r = creditInputSchema.safeParse(input);
  if (!r.success) throw new CreditInputError(toIssues(r.error));
}

export function validateChargebackInput(input: ChargebackInput): void {
  const r = chargebackInputSchema.safeParse(input);
  if (!r.success) throw new CreditInputError(toIssues(r.error));
}
