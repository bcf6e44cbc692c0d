import { describe, expect, it } from 'vitest';
import { CURRENCY_CODES, assertCurrencyCode, isCurrencyCode, minorUnitExponent } from '@/lib/money';

describe('ISO 4217 minor-unit exponents', () => {
  it.each([
    // ISO 4217 list one (current currency & funds), minor unit column — values from memory.
    ['USD', 2],
    ['EUR', 2],
    ['CAD', 2],
    ['GBP', 2],
    ['JPY', 0],
    ['KRW', 0],
    ['BHD', 3],
  ] as const)('%s has exponent %i (ISO 4217, from memory)', (code, exponent) => {
    expect(minorUnitExponent(code)).toBe(exponent);
  });

  it('agrees with CLDR currency digits as shipped in ICU (Intl.NumberFormat) for every supported code', () => {
    for (const code of CURRENCY_CODES) {
      const cldr = new Intl.NumberFormat('en', { style: 'currency', currency: code }).resolvedOptions()
        .maximumFractionDigits;
      expect({ code, exponent: minorUnitExponent(code) }).toEqual({ code, exponent: cldr });
    }
  });

  it('refuses an unknown or lower-case code with the field named', () => {
    expect(isCurrencyCode('usd')).toBe(false);
    expect(() => assertCurrencyCode('XYZ', 'brand.currency')).toThrow(/^brand.currency: "XYZ" is not a supported/);
  });
});
