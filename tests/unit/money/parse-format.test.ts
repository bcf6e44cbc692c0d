import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CURRENCY_CODES, formatMoney, minorUnitExponent, parseAmount, toDecimalString } from '@/lib/money';
import type { CurrencyCode, DecimalSeparator } from '@/lib/money';

const ok = (text: string, currency: CurrencyCode = 'USD', decimalSeparator: DecimalSeparator = '.') => {
  const r = parseAmount(text, { currency, decimalSeparator });
  if (!r.ok) throw new Error(r.message);
  return r.value;
};
const err = (text: string, currency: CurrencyCode = 'USD', decimalSeparator: DecimalSeparator = '.') => {
  const r = parseAmount(text, { currency, decimalSeparator });
  if (r.ok) throw new Error(`expected ${text} to be refused, got ${r.value}`);
  return r.message;
};

describe('parseAmount (hand-worked cases)', () => {
  it('reads dot-decimal amounts with comma, apostrophe or space grouping', () => {
    expect(ok('1,234.50')).toBe(123450);
    expect(ok("1'234.50")).toBe(123450);
    expect(ok('1 234.50')).toBe(123450);
    expect(ok('-12.3')).toBe(-1230);
    expect(ok('0.07')).toBe(7);
    expect(ok('+5')).toBe(500);
  });

  it('reads comma-decimal amounts when the statement says so', () => {
    expect(ok('1.234,50', 'EUR', ',')).toBe(123450);
    expect(ok('1 234,50', 'EUR', ',')).toBe(123450);
    expect(ok('-0,05', 'EUR', ',')).toBe(-5);
  });

  it('reads parentheses and a trailing minus as negative (statement conventions)', () => {
    expect(ok('(12.30)')).toBe(-1230);
    expect(ok('12.30-')).toBe(-1230);
    expect(ok('($1,000.00)')).toBe(-100000);
    expect(ok('-$5')).toBe(-500);
    expect(ok('$-5')).toBe(-500);
    expect(ok('USD (12.30)')).toBe(-1230);
  });

  it('accepts the currency code or symbol of the statement currency only', () => {
    expect(ok('USD 12.00')).toBe(1200);
    expect(ok('12.00 usd')).toBe(1200);
    expect(ok('12,30 €', 'EUR', ',')).toBe(1230);
    expect(ok('£7.10', 'GBP')).toBe(710);
    expect(err('€12.30')).toMatch(/marked "€" but this statement is in USD/);
    expect(err('EUR 5')).toMatch(/marked "EUR" but this statement is in USD/);
  });

  it('handles 0- and 3-exponent currencies exactly', () => {
    expect(ok('1,234', 'JPY')).toBe(1234);
    expect(ok('¥1,200', 'JPY')).toBe(1200);
    expect(err('1.5', 'JPY')).toMatch(/JPY has no minor unit/);
    expect(ok('1.234', 'BHD')).toBe(1234);
  });

  it('refuses the other locale, surplus decimals, bad grouping and double signs with a reason', () => {
    expect(err('1.234,50')).toMatch(/looks written with "," as the decimal separator, but this statement is set to "\."/);
    expect(err('1,234.50', 'EUR', ',')).toMatch(/looks written with "\." as the decimal separator|not a number/);
    expect(err('12.345')).toMatch(/has 3 decimals, but USD has 2/);
    expect(ok('12.300')).toBe(1230); // surplus zeros are exact
    expect(err('1,23,456.00')).toMatch(/grouping must be in threes/);
    expect(err('--5')).toMatch(/more than one minus/);
    expect(err('(-5)')).toMatch(/more than one minus/);
    expect(err('')).toMatch(/empty/);
    expect(err('n/a')).toMatch(/no digits/);
    expect(err('5.')).toMatch(/no decimals/);
    expect(err('1.2.3')).toMatch(/more than one decimal separator/);
    expect(err('99999999999999999')).toMatch(/too large/);
  });
});

describe('round trip against Intl.NumberFormat (ICU/CLDR) as an independent writer', () => {
  const writers: ReadonlyArray<[string, DecimalSeparator]> = [
    ['en-US', '.'],
    ['de-DE', ','],
    ['fr-FR', ','],
    ['de-CH', '.'],
    ['ja-JP', '.'],
  ];
  it('parses what ICU prints in several locales, back to the same minor units', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -(10 ** 13), max: 10 ** 13 }),
        fc.constantFrom<CurrencyCode>('USD', 'EUR', 'GBP', 'CAD', 'JPY', 'CHF'),
        fc.constantFrom(...writers),
        (minor, currency, [locale, sep]) => {
          const printed = formatMoney(minor, currency, { locale });
          const back = parseAmount(printed, { currency, decimalSeparator: sep });
          expect(back).toEqual({ ok: true, value: minor });
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('toDecimalString gives plain dot decimals with the currency exponent', () => {
    expect(toDecimalString(123450, 'USD')).toBe('1234.50');
    expect(toDecimalString(-5, 'EUR')).toBe('-0.05');
    expect(toDecimalString(1200, 'JPY')).toBe('1200');
    expect(toDecimalString(1234, 'BHD')).toBe('1.234');
    for (const c of CURRENCY_CODES) {
      expect(parseAmount(toDecimalString(-987654321, c), { currency: c })).toEqual({ ok: true, value: -987654321 });
      expect(toDecimalString(1, c).split('.')[1]?.length ?? 0).toBe(minorUnitExponent(c));
    }
  });

  it('formats for display with the currency (CLDR patterns)', () => {
    expect(formatMoney(123450, 'USD')).toBe('$1,234.50');
    expect(formatMoney(-1230, 'USD', { accounting: true })).toBe('($12.30)');
    expect(formatMoney(-123450, 'EUR', { locale: 'de-DE' })).toBe('-1.234,50\u00a0€');
    expect(formatMoney(90071992547409, 'USD')).toBe('$900,719,925,474.09');
  });
});
