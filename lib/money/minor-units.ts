import { decimalToShortString, parseExactDecimal, type ExactDecimal } from './exact-decimal';
import { roundQuotient } from './rounding';

/**
 * Representation, chosen once: an amount is a JavaScript `number` holding a whole count of minor
 * units (cents; yen for JPY), always checked with Number.isSafeInteger. That keeps amounts
 * JSON-serialisable for server → client props while staying exact up to ±9,007,199,254,740,991
 * minor units. Products and sums are computed in bigint and converted back through `fromBigInt`,
 * which refuses anything outside the safe range. The database column is bigint (minor units).
 */
export type MinorUnits = number;

export class MoneyRangeError extends RangeError {}

export function isMinorUnits(value: unknown): value is MinorUnits {
  return typeof value === 'number' && Number.isSafeInteger(value);
}

export function assertMinorUnits(value: unknown, field: string): asserts value is MinorUnits {
  if (!isMinorUnits(value)) {
    throw new MoneyRangeError(
      `${field}: ${String(value)} is not a whole number of minor units within the safe integer range`,
    );
  }
}

export function fromBigInt(value: bigint, field = 'amount'): MinorUnits {
  if (value > BigInt(Number.MAX_SAFE_INTEGER) || value < BigInt(Number.MIN_SAFE_INTEGER)) {
    throw new MoneyRangeError(`${field}: ${value} minor units is outside the safe integer range`);
  }
  return Number(value);
}

/** Negation without a negative zero (vitest and Object.is tell −0 from 0). */
export function negateMinor(value: MinorUnits): MinorUnits {
  return value === 0 ? 0 : -value;
}

export function addMinor(a: MinorUnits, b: MinorUnits): MinorUnits {
  return fromBigInt(BigInt(a) + BigInt(b), 'sum');
}

export function sumMinor(values: Iterable<MinorUnits>): MinorUnits {
  let total = 0n;
  for (const v of values) {
    assertMinorUnits(v, 'summand');
    total += BigInt(v);
  }
  return fromBigInt(total, 'sum');
}

export function multiplyMinorByInteger(amount: MinorUnits, factor: number, field = 'product'): MinorUnits {
  assertMinorUnits(amount, field);
  if (!Number.isSafeInteger(factor)) throw new MoneyRangeError(`${field}: factor ${factor} is not a whole number`);
  return fromBigInt(BigInt(amount) * BigInt(factor), field);
}

/**
 * amount × factor with the factor an exact decimal ("1.25" hours, "0.06" probability), computed
 * exactly and rounded once by the house rule (see rounding.ts).
 */
export function multiplyMinorByDecimal(amount: MinorUnits, factor: string | ExactDecimal, field = 'product'): MinorUnits {
  assertMinorUnits(amount, field);
  let d: ExactDecimal;
  if (typeof factor === 'string') {
    const parsed = parseExactDecimal(factor);
    if (!parsed.ok) throw new MoneyRangeError(`${field}: ${parsed.message}`);
    d = parsed.value;
  } else {
    d = factor;
  }
  return fromBigInt(roundQuotient(BigInt(amount) * d.units, 10n ** BigInt(d.scale)), field);
}

/** The exact product as a decimal string of minor units, for showing what was rounded ("312.5"). */
export function exactProductText(amount: MinorUnits, factor: ExactDecimal): string {
  return decimalToShortString({ units: BigInt(amount) * factor.units, scale: factor.scale });
}
