import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  addMinor,
  assertMinorUnits,
  decimalToString,
  exactProductText,
  negateMinor,
  parseExactDecimal,
  sumMinor,
} from '@/lib/money';

describe('minor units as safe integers', () => {
  it('sums exactly, equal to a BigInt recomputation', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -(10 ** 12), max: 10 ** 12 }), { maxLength: 200 }), (values) => {
        const big = values.reduce((a, v) => a + BigInt(v), 0n);
        expect(BigInt(sumMinor(values))).toBe(big);
      }),
    );
  });

  it('refuses a float, NaN or an out-of-range sum, naming the field', () => {
    expect(() => sumMinor([1, 0.5])).toThrow(/summand: 0.5 is not a whole number/);
    expect(() => assertMinorUnits(Number.NaN, 'freight')).toThrow(/^freight: NaN/);
    expect(() => addMinor(Number.MAX_SAFE_INTEGER, 1)).toThrow(/outside the safe integer range/);
  });

  it('negates without producing −0', () => {
    expect(Object.is(negateMinor(0), 0)).toBe(true);
    expect(negateMinor(-5)).toBe(5);
  });
});

describe('exact decimal strings', () => {
  it('parses and prints back', () => {
    for (const t of ['1.25', '-0.5', '3', '0.000', '120.10']) {
      const p = parseExactDecimal(t);
      expect(p.ok && decimalToString(p.value)).toBe(t);
    }
  });

  it('refuses what is not a plain dot decimal', () => {
    for (const t of ['1,5', '1e2', '', '.5', '1.', 'one']) expect(parseExactDecimal(t).ok).toBe(false);
  });

  it('shows an exact product for the basis of a rounded line', () => {
    const h = parseExactDecimal('0.25');
    expect(h.ok && exactProductText(10, h.value)).toBe('2.5');
    const g = parseExactDecimal('2.00');
    expect(g.ok && exactProductText(7, g.value)).toBe('14');
  });
});
