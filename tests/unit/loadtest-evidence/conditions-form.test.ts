import fc from 'fast-check';
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { conditionsFromForm, conditionsToForm, EMPTY_CONDITIONS_FORM } from '@/lib/loadtest-evidence';

const ok = (form: Parameters<typeof conditionsFromForm>[0], units: 'metric' | 'imperial') => {
  const r = conditionsFromForm(form, units);
  if (!r.ok) throw new Error(JSON.stringify(r.fieldErrors));
  return r.conditions;
};

describe('test conditions typed in the user’s units are stored in SI', () => {
  it('metric: bar → Pa (1 bar = 1.0 E+05 Pa exactly, NIST SP 811 B.8), kg and °C as typed, decimal commas read', () => {
    const c = ok({ tyrePressure: '3,5', tyreMaxPressure: '4', load: '82.5', ambientTemp: '-3', batterySocStartPct: '97', measuredCircumference: '2290' }, 'metric');
    expect(c).toMatchObject({ tyrePressurePa: 350_000, tyreMaxPressurePa: 400_000, loadKg: 82.5, ambientTempC: -3, batterySocStartPct: 97, measuredCircumferenceMm: 2290 });
  });

  it('imperial: psi, lb, °F and inches against NIST SP 811 B.8/B.9 and against mathjs as an independent library', () => {
    const c = ok({ tyrePressure: '50', load: '176', ambientTemp: '68', measuredCircumference: '87' }, 'imperial');
    // NIST SP 811 B.8: pound-force per square inch → 6.894 757 E+03 Pa.
    expect(c.tyrePressurePa! / 50).toBeCloseTo(6894.757, 3);
    // mathjs's psi comes out at 6894.757292765 Pa, about 6e-11 relative below the exact 6894.757293168: close, not equal.
    expect(Math.abs(c.tyrePressurePa! / unit(50, 'psi').toNumber('Pa') - 1)).toBeLessThan(1e-9);
    // Pound (avoirdupois) → 0.453 592 37 kg exactly.
    expect(c.loadKg!).toBeCloseTo(176 * 0.45359237, 12);
    expect(c.loadKg!).toBeCloseTo(unit(176, 'lbm').toNumber('kg'), 9);
    // NIST SP 811 B.9: t/°C = (t/°F − 32)/1.8 → 68 °F = 20 °C.
    expect(c.ambientTempC!).toBeCloseTo(20, 12);
    expect(c.ambientTempC!).toBeCloseTo(unit(68, 'degF').toNumber('degC'), 9);
    // Inch = 2.54 E-02 m exactly → 87 in = 2209.8 mm.
    expect(c.measuredCircumferenceMm).toBe(2209.8);
  });

  it('tyre sizes are stored as the ISO 5775 designation', () => {
    expect(ok({ tyreSize: 'ETRTO 57-622' }, 'metric').tyreSize).toBe('57-622');
    // 700C is a 622 mm bead seat (ISO 5775; reference-values.md).
    expect(ok({ tyreSize: '700 x 35C' }, 'metric').tyreSize).toBe('35-622');
    expect(ok({ tyreSize: '27.5 x 2.40' }, 'imperial').tyreSize).toBe('61-584');
  });

  it('an empty form records nothing and is accepted', () => {
    expect(ok(EMPTY_CONDITIONS_FORM, 'metric')).toEqual({
      batterySocStartPct: null, tyreSize: null, measuredCircumferenceMm: null, tyrePressurePa: null, tyreMaxPressurePa: null, dynoId: null,
      rollerId: null, loadKg: null, ambientTempC: null, notes: '',
    });
  });

  it('refusals name the field and give the range in the user’s own units', () => {
    const metric = conditionsFromForm({ tyrePressure: 'full', batterySocStartPct: '101', ambientTemp: '61', tyreSize: '26 x 1 3/8', notes: 'x'.repeat(1001) }, 'metric');
    expect(metric.ok).toBe(false);
    if (metric.ok) return;
    expect(metric.fieldErrors.tyrePressure).toEqual(['Tyre pressure must be a number, like 3.5.']);
    expect(metric.fieldErrors.batterySocStartPct).toEqual(['Battery charge at start must be between 0 % and 100 %.']);
    expect(metric.fieldErrors.ambientTemp).toEqual(['Room temperature must be between -40 °C and 60 °C.']);
    expect(metric.fieldErrors.tyreSize?.[0]).toMatch(/fractional inch size/);
    expect(metric.fieldErrors.notes?.[0]).toMatch(/at most 1000 characters/);
    const imperial = conditionsFromForm({ tyrePressure: '300', load: '1200', ambientTemp: '150', measuredCircumference: '10' }, 'imperial');
    if (imperial.ok) throw new Error('expected refusals');
    // 20 bar = 290.1 psi; 500 kg = 1102 lb; 60 °C = 140 °F; 500 mm = 19.7 in.
    expect(imperial.fieldErrors.tyrePressure).toEqual(['Tyre pressure must be between 0 psi and 290 psi.']);
    expect(imperial.fieldErrors.load).toEqual(['Rider or load must be between 0 lb and 1102 lb.']);
    expect(imperial.fieldErrors.ambientTemp).toEqual(['Room temperature must be between -40 °F and 140 °F.']);
    expect(imperial.fieldErrors.measuredCircumference).toEqual(['Measured wheel circumference must be between 19.7 in and 137.8 in.']);
  });

  it('stored conditions shown again in the form read back to the same SI values (both unit systems)', () => {
    fc.assert(
      fc.property(
        fc.record({
          soc: fc.integer({ min: 0, max: 100 }),
          barTenths: fc.integer({ min: 10, max: 80 }),
          kg: fc.integer({ min: 40, max: 200 }),
          c: fc.integer({ min: -10, max: 40 }),
        }),
        fc.constantFrom('metric' as const, 'imperial' as const),
        ({ soc, barTenths, kg, c }, units) => {
          const si = ok({ batterySocStartPct: String(soc), tyrePressure: String(barTenths / 10), load: String(kg), ambientTemp: String(c), tyreSize: '57-622' }, 'metric');
          const again = ok(conditionsToForm(si, units), units);
          expect(again.batterySocStartPct).toBe(si.batterySocStartPct);
          expect(again.tyreSize).toBe('57-622');
          // The form rounds to what a gauge reads: 0.01 bar / 0.1 psi, 0.1 kg or lb, 1 degree.
          expect(Math.abs(again.tyrePressurePa! - si.tyrePressurePa!)).toBeLessThanOrEqual(units === 'metric' ? 0 : 0.05 * 6894.76);
          expect(Math.abs(again.loadKg! - si.loadKg!)).toBeLessThanOrEqual(0.05 * 0.4536);
          expect(Math.abs(again.ambientTempC! - si.ambientTempC!)).toBeLessThanOrEqual(0.5 / 1.8);
        },
      ),
    );
  });
});
