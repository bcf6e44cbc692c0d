import fc from 'fast-check';
import { median } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { movingAverage, parseDecimal, speedBins } from '@/lib/loadtest';
import { medianInPlace } from '@/lib/loadtest/select';

describe('parseDecimal (fast-check against Number())', () => {
  const decimal = fc
    .tuple(fc.boolean(), fc.stringMatching(/^\d{1,9}$/), fc.option(fc.stringMatching(/^\d{0,8}$/), { nil: undefined }))
    .map(([neg, int, frac]) => `${neg ? '-' : ''}${int}${frac === undefined ? '' : `.${frac}`}`);

  it('gives exactly the double Number() gives for plain decimals', () => {
    fc.assert(fc.property(decimal, (s) => Object.is(parseDecimal(s, '.'), Number(s)) || (Number(s) === 0 && parseDecimal(s, '.') === 0)));
  });

  it('reads decimal commas the same way', () => {
    fc.assert(fc.property(decimal, (s) => parseDecimal(s.replace('.', ','), ',') === Number(s)));
  });

  it('reads exponents, spaces and long digit strings through the strict path', () => {
    expect(parseDecimal('1.5e3', '.')).toBe(1500);
    expect(parseDecimal(' 12.5 ', '.')).toBe(12.5);
    expect(parseDecimal('12345678901234567.5', '.')).toBe(12345678901234567.5);
    expect(parseDecimal('2,5E-1', ',')).toBe(0.25);
  });

  it('refuses what is not a plain number', () => {
    for (const s of ['', ' ', '-', '.', 'abc', '0x1F', 'Infinity', '1,234.5', '1.2.3', '12 5', 'NaN']) expect(parseDecimal(s, '.')).toBeNaN();
    for (const s of ['1.5', '1,2,3', '']) expect(parseDecimal(s, ',')).toBeNaN();
  });
});

describe('median by quickselect (fast-check against mathjs median)', () => {
  // mathjs compares with a relative epsilon (1e-12), so values closer than that may sort either way
  // there; readings on a 1/7 grid keep the two orderings the same.
  it('equals mathjs median for any list', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1e6, max: 1e6 }).map((x) => x / 7), { minLength: 1, maxLength: 200 }), (xs) => {
        return medianInPlace(Float64Array.from(xs)) === Number(median(xs));
      }),
    );
  });
});

describe('moving average and bins (properties)', () => {
  it('a constant signal stays exactly constant', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1000, noNaN: true }), fc.integer({ min: 1, max: 300 }), (c, n) => {
        const t = Float64Array.from({ length: n }, (_, i) => i * 0.013);
        return movingAverage(t, new Float64Array(n).fill(c), 0.2).every((x) => x === c);
      }),
    );
  });

  it('a linear signal is unchanged away from the ends (a centred window averages a line to its middle)', () => {
    const t = Float64Array.from({ length: 1000 }, (_, i) => i / 100);
    const y = Float64Array.from(t, (x) => 3 * x + 1);
    const s = movingAverage(t, y, 0.2);
    for (let i = 20; i < 980; i++) expect(s[i]).toBeCloseTo(y[i] as number, 9);
  });

  it('bin counts add up to the sample count', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 20, noNaN: true }), { minLength: 1, maxLength: 300 }), (vs) => {
        const v = Float64Array.from(vs);
        const bins = speedBins(v, v, null, 'imperial');
        return bins.reduce((s, b) => s + b.count, 0) === vs.length;
      }),
    );
  });

  it('a speed exactly on a bin edge (5 km/h) falls in the bin it starts', () => {
    const v = Float64Array.from([5 / 3.6, 6 / 3.6 - 1e-6]);
    expect(speedBins(v, v, null, 'metric').map((b) => [b.index, b.count])).toEqual([[5, 2]]);
  });
});
