import fc from 'fast-check';
import { bignumber } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { multiplyMinorByDecimal, roundQuotient } from '@/lib/money';

// Independent references: decimal.js ROUND_HALF_UP (rounding mode 4, "away from zero when
// equidistant"), reached through mathjs's BigNumber, and ECMA-402 roundingMode "halfExpand".
const HALF_UP = 4;
const ref = (numerator: bigint, denominator: bigint) =>
  bignumber(numerator.toString()).div(bignumber(denominator.toString())).toDecimalPlaces(0, HALF_UP).toFixed(0);
const intl = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0, roundingMode: 'halfExpand', useGrouping: false });

describe('house rounding rule: half away from zero', () => {
  it.each([
    // [numerator, denominator, expected]; values in minor units (cents)
    [15n, 10n, 2n], // 1.5 cents
    [25n, 10n, 3n], // 2.5 cents
    [-25n, 10n, -3n], // −2.5 cents
    [-15n, 10n, -2n],
    [24999n, 10000n, 2n],
    [-24999n, 10000n, -2n],
    [5n, 10n, 1n],
    [-5n, 10n, -1n],
    [4n, 10n, 0n],
    [0n, 7n, 0n],
  ])('%s / %s → %s (agrees with decimal.js ROUND_HALF_UP and Intl halfExpand)', (n, d, expected) => {
    expect(roundQuotient(n, d)).toBe(expected);
    expect(ref(n, d)).toBe(expected.toString());
    const intlText = intl.format(`${Number(n) / Number(d)}` as `${number}`);
    expect(intlText === '-0' ? '0' : intlText).toBe(expected.toString());
  });

  it('is symmetric: round(−x) = −round(x), the property reversals rely on', () => {
    fc.assert(
      fc.property(fc.bigInt({ min: -(10n ** 15n), max: 10n ** 15n }), fc.bigInt({ min: 1n, max: 10n ** 6n }), (n, d) => {
        expect(roundQuotient(-n, d)).toBe(-roundQuotient(n, d));
      }),
    );
  });

  it('matches decimal.js ROUND_HALF_UP on random quotients', () => {
    fc.assert(
      fc.property(fc.bigInt({ min: -(10n ** 18n), max: 10n ** 18n }), fc.bigInt({ min: 1n, max: 10n ** 9n }), (n, d) => {
        expect(roundQuotient(n, d).toString()).toBe(ref(n, d));
      }),
      { numRuns: 2000 },
    );
  });

  it('refuses a zero or negative denominator', () => {
    expect(() => roundQuotient(1n, 0n)).toThrow(/denominator/);
    expect(() => roundQuotient(1n, -2n)).toThrow(/denominator/);
  });
});

describe('rate × decimal hours, one rounding', () => {
  it.each([
    [10, '0.15', 2], // 1.5 cents → 2
    [10, '0.25', 3], // 2.5 cents → 3
    [-10, '0.25', -3], // −2.5 cents → −3
    [7500, '1.25', 9375], // 75.00/h × 1.25 h = 93.75 (hand-worked)
    [6250, '0.3', 1875], // 62.50/h × 0.3 h = 18.75
    [3333, '0.5', 1667], // 16.665 → 16.67
    [9999, '0.125', 1250], // 1249.875 → 1250
  ])('%i minor/h × %s h = %i minor (hand-worked, checked with decimal.js)', (rate, hours, expected) => {
    expect(multiplyMinorByDecimal(rate, hours)).toBe(expected);
    expect(bignumber(rate).times(bignumber(hours)).toDecimalPlaces(0, HALF_UP).toNumber()).toBe(expected);
  });

  it('rounds once: exact product, not a rounded intermediate', () => {
    // 10 minor/h × 0.345 h = 3.45 → 3; rounding the hours to 0.35 first would give 3.5 → 4.
    expect(multiplyMinorByDecimal(10, '0.345')).toBe(3);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 1_000_000 }),
        fc.integer({ min: 0, max: 100_000 }),
        fc.integer({ min: 0, max: 4 }),
        (rate, hoursUnits, scale) => {
          const hours = (hoursUnits / 10 ** scale).toFixed(scale);
          const expected = bignumber(rate).times(bignumber(hours)).toDecimalPlaces(0, HALF_UP).toNumber();
          expect(multiplyMinorByDecimal(rate, hours)).toBe(expected);
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('refuses a malformed factor and a result beyond the safe range', () => {
    expect(() => multiplyMinorByDecimal(100, '1,5', 'labor')).toThrow(/labor: "1,5" is not a decimal number/);
    expect(() => multiplyMinorByDecimal(100, '1e3')).toThrow(/not a decimal number/);
    expect(() => multiplyMinorByDecimal(Number.MAX_SAFE_INTEGER, '2')).toThrow(/safe integer range/);
    expect(() => multiplyMinorByDecimal(1.5, '2')).toThrow(/whole number of minor units/);
  });
});
