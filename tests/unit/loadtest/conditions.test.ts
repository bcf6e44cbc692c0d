import { describe, expect, it } from 'vitest';
import { compareConditions, validateConditions, type TestConditions } from '@/lib/loadtest';

const base: TestConditions = {
  batterySocStartPct: 100,
  tyreSize: '57-622',
  tyrePressurePa: 3.5e5,
  tyreMaxPressurePa: 3.5e5,
  dynoId: 'Bench A',
  rollerId: 'R-2',
  loadKg: 80,
  ambientTempC: 20,
  notes: '',
};

describe('compareConditions (tolerances: common practice, no source)', () => {
  it('identical conditions are comparable, with no advice', () => {
    const c = compareConditions(base, { ...base, notes: 'after repair' });
    expect(c.comparable).toBe(true);
    expect(c.differences).toEqual([]);
    expect(c.advice).toEqual([]);
  });

  it('state of charge: 5 points apart is within, 6 is not', () => {
    expect(compareConditions({ ...base, batterySocStartPct: 100 }, { ...base, batterySocStartPct: 95 }).comparable).toBe(true);
    const c = compareConditions({ ...base, batterySocStartPct: 100 }, { ...base, batterySocStartPct: 94 });
    expect(c.comparable).toBe(false);
    expect(c.differences[0]).toBe('Battery charge at start differs by 6 points (before 100 %, after 94 %); allowed 5 points.');
    expect(c.advice[0]).toMatch(/94 % at the start of the after run; charge it fully right before each run/);
  });

  it('tyre pressure: 0.1 bar apart is within, 0.11 bar is not; below the sidewall maximum is advice', () => {
    expect(compareConditions(base, { ...base, tyrePressurePa: 3.4e5, tyreMaxPressurePa: 3.5e5 }).comparable).toBe(true);
    const c = compareConditions(base, { ...base, tyrePressurePa: 3.39e5 });
    expect(c.differences[0]).toMatch(/^Tyre pressure differs by 0\.11 bar/);
    expect(c.advice[0]).toMatch(/below its sidewall maximum of 3\.5 bar; inflate to the sidewall maximum/);
    expect(compareConditions(base, { ...base, tyrePressurePa: 3.39e5 }, 'imperial').differences[0]).toMatch(/psi/);
  });

  it('the same tyre written as an inch size and as ISO is the same tyre; another size is not', () => {
    expect(compareConditions(base, { ...base, tyreSize: '29 x 2.25' }).comparable).toBe(true);
    const c = compareConditions(base, { ...base, tyreSize: '60-584' });
    expect(c.differences).toEqual(['Tyre size differs: 57-622 before, 60-584 after. Use the same tyre and wheel for both runs.']);
  });

  it('another dyno or roller, temperature more than 10 °C apart, load more than 5 kg apart', () => {
    const c = compareConditions(base, { ...base, dynoId: 'bench b', rollerId: ' r-2 ', ambientTempC: 31, loadKg: 86 });
    expect(c.checks.find((x) => x.field === 'rollerId')?.status).toBe('same');
    expect(c.differences).toEqual([
      'Dyno differs: "Bench A" before, "bench b" after. Run both tests on the same dyno.',
      'Rider or load differs by 6 kg (before 80 kg, after 86 kg); allowed 5 kg.',
      'Ambient temperature differs by 11 °C (before 20 °C, after 31 °C); allowed 10 °C.',
    ]);
    expect(compareConditions(base, { ...base, ambientTempC: 30, loadKg: 85 }).comparable).toBe(true);
  });

  it('a value recorded for one run only makes the runs not comparable; recorded for neither is only noted', () => {
    const c = compareConditions(base, { ...base, dynoId: null, loadKg: null });
    expect(c.comparable).toBe(false);
    expect(c.differences[0]).toBe('Dyno was recorded for the before run only, so the runs cannot be compared on it.');
    const none = compareConditions({ ...base, loadKg: null }, { ...base, loadKg: null });
    expect(none.comparable).toBe(true);
    expect(none.checks.find((x) => x.field === 'loadKg')?.status).toBe('not-recorded');
  });

  it('validates a form entry field by field', () => {
    expect(validateConditions({ ...base, batterySocStartPct: 120, tyreSize: '26 x 1 3/8', ambientTempC: 99 }).map((e) => e.field)).toEqual([
      'batterySocStartPct',
      'ambientTempC',
      'tyreSize',
    ]);
    expect(validateConditions(base)).toEqual([]);
  });
});
