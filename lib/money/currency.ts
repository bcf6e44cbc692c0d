/**
 * Currencies a brand may bill in, with the ISO 4217 minor-unit exponent (the number of decimal
 * places of the minor unit). One currency per brand; amounts of two currencies are never added.
 */
const MINOR_UNIT_EXPONENT = {
  USD: 2,
  EUR: 2,
  GBP: 2,
  CAD: 2,
  AUD: 2,
  NZD: 2,
  CHF: 2,
  SEK: 2,
  NOK: 2,
  DKK: 2,
  PLN: 2,
  CZK: 2,
  JPY: 0,
  KRW: 0,
  ISK: 0,
  BHD: 3,
  KWD: 3,
  JOD: 3,
  OMR: 3,
  TND: 3,
} as const satisfies Record<string, 0 | 2 | 3>;

export type CurrencyCode = keyof typeof MINOR_UNIT_EXPONENT;

export const CURRENCY_CODES = Object.keys(MINOR_UNIT_EXPONENT) as CurrencyCode[];

export function isCurrencyCode(value: unknown): value is CurrencyCode {
  return typeof value === 'string' && Object.prototype.hasOwnProperty.call(MINOR_UNIT_EXPONENT, value);
}

/** Throws a message naming the field when `value` is not a supported ISO 4217 code. */
export function assertCurrencyCode(value: unknown, field = 'currency'): asserts value is CurrencyCode {
  if (!isCurrencyCode(value)) {
    throw new RangeError(
      `${field}: ${JSON.stringify(value)} is not a supported ISO 4217 currency code (supported: ${CURRENCY_CODES.join(', ')})`,
    );
  }
}

export function minorUnitExponent(currency: CurrencyCode): 0 | 2 | 3 {
  return MINOR_UNIT_EXPONENT[currency];
}

/** 10^exponent as a bigint: minor units per major unit (100 for USD, 1 for JPY). */
export function minorPerMajor(currency: CurrencyCode): bigint {
  return 10n ** BigInt(MINOR_UNIT_EXPONENT[currency]);
}
