import { minorUnitExponent, type CurrencyCode } from './currency';
import type { MinorUnits } from './minor-units';

/**
 * The amount as a plain decimal string with a dot and exactly the currency's decimals:
 * 123450 USD → "1234.50", −5 USD → "-0.05", 1200 JPY → "1200". For CSV exports and APIs.
 */
export function toDecimalString(amount: MinorUnits, currency: CurrencyCode): string {
  if (!Number.isSafeInteger(amount)) throw new RangeError(`amount ${amount} is not a whole number of minor units`);
  const exponent = minorUnitExponent(currency);
  const negative = amount < 0;
  const digits = Math.abs(amount).toString().padStart(exponent + 1, '0');
  const body = exponent === 0 ? digits : `${digits.slice(0, -exponent)}.${digits.slice(-exponent)}`;
  return negative ? `-${body}` : body;
}

export interface FormatMoneyOptions {
  /** BCP 47 locale of the reader; default en-US. */
  locale?: string;
  /** Show negatives in parentheses, as on printed statements. */
  accounting?: boolean;
}

const formatters = new Map<string, Intl.NumberFormat>();

/**
 * The amount for display with its currency, in the reader's locale ("$1,234.50", "1.234,50 €").
 * The exact decimal string is handed to Intl.NumberFormat, so no float ever carries the value.
 */
export function formatMoney(amount: MinorUnits, currency: CurrencyCode, options: FormatMoneyOptions = {}): string {
  const locale = options.locale ?? 'en-US';
  const key = `${locale}|${currency}|${options.accounting ? 'a' : 's'}`;
  let nf = formatters.get(key);
  if (!nf) {
    const exponent = minorUnitExponent(currency);
    nf = new Intl.NumberFormat(locale, {
      style: 'currency',
      currency,
      currencySign: options.accounting ? 'accounting' : 'standard',
      minimumFractionDigits: exponent,
      maximumFractionDigits: exponent,
    });
    formatters.set(key, nf);
  }
  // Intl.NumberFormat.format takes a decimal string (ES2023) and formats it exactly.
  return nf.format(toDecimalString(amount, currency) as `${number}`);
}
