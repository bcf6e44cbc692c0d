import { describe, expect, it } from 'vitest';
import { analyseBattery, analyseDyno, compareBatteryRuns, compareRuns, parseBatteryCsv, parseDynoCsv, type DynoAnalysis, type TestConditions } from '@/lib/loadtest';
import { closedForm, DEFAULT_CURVE, samples, toMetricCsv } from './synthetic';

function analysed(peakPowerW: number, units: 'metric' | 'imperial' = 'metric'): DynoAnalysis {
  const r = parseDynoCsv(toMetricCsv(samples({ ...DEFAULT_CURVE, peakPowerW, rateHz: 200 })));
  if (r.status !== 'ok') throw new Error(r.status);
  return analyseDyno(r.run, { circumferenceM: DEFAULT_CURVE.circumferenceM, units });
}

describe('compareRuns: before vs after against the part spec', () => {
  const before = analysed(300);
  const after = analysed(500);
  const stall500 = closedForm({ ...DEFAULT_CURVE, peakPowerW: 500 }).stallTorqueNm;

  it('deltas at the peaks', () => {
    const c = compareRuns(before, after, { minWheelPowerW: 450, minWheelTorqueNm: null });
    expect(c.peakPowerW.before).toBeCloseTo(300, 0);
    expect(c.peakPowerW.delta).toBeCloseTo(200, 0);
    expect(c.peakPowerW.deltaPct).toBeCloseTo(66.67, 1);
    expect(c.topSpeedMs.delta).toBeCloseTo(0, 9);
  });

  it('per speed bin: power scales by 5/3 in every bin shared by both runs', () => {
    const c = compareRuns(before, after, { minWheelPowerW: 450, minWheelTorqueNm: null });
    expect(c.bins.length).toBe(33);
    for (const b of c.bins.filter((x) => x.index > 0 && x.index < 32)) expect(b.power?.deltaPct).toBeCloseTo(66.67, 1);
    expect(c.binsOnlyBefore).toEqual([]);
  });

  it('verdicts: "meets" at or above the minimum, "below by x %" under it; the after-run decides', () => {
    const c = compareRuns(before, after, { minWheelPowerW: 450, minWheelTorqueNm: stall500 * 0.9 });
    expect(c.before.power.status).toBe('below');
    expect(c.before.power.status === 'below' && c.before.power.belowByPct).toBeCloseTo(((450 - 300) / 450) * 100, 0);
    expect(c.before.power.message).toMatch(/^Below by 33\.\d %: peak wheel power 300 W < 450 W\.$/);
    expect(c.after.power.status).toBe('meets');
    expect(c.after.torque.status).toBe('meets');
    expect(c.repairVerified).toBe(true);
    expect(compareRuns(before, after, { minWheelPowerW: 501, minWheelTorqueNm: null }).repairVerified).toBe(false);
  });

  it('at exactly the minimum = meets', () => {
    const c = compareRuns(before, after, { minWheelPowerW: after.peakPower.watts, minWheelTorqueNm: null });
    expect(c.after.power.status).toBe('meets');
  });

  it('includes the conditions comparison', () => {
    const cond: TestConditions = { batterySocStartPct: 100, tyreSize: '57-622', tyrePressurePa: 3.5e5, tyreMaxPressurePa: 3.5e5, dynoId: 'A', rollerId: null, loadKg: null, ambientTempC: 18, notes: '' };
    const c = compareRuns(before, after, { minWheelPowerW: 450, minWheelTorqueNm: null }, { conditions: { before: cond, after: { ...cond, batterySocStartPct: 80 } } });
    expect(c.conditions?.comparable).toBe(false);
    expect(c.repairVerified).toBe(true); // conditions are for the rep to weigh; the spec decides
  });

  it('refuses runs binned differently and a spec with no minimum', () => {
    expect(() => compareRuns(before, analysed(500, 'imperial'), { minWheelPowerW: 1, minWheelTorqueNm: null })).toThrow(/same units/);
    expect(() => compareRuns(before, after, { minWheelPowerW: null, minWheelTorqueNm: null })).toThrow(/needs a minimum/);
    expect(() => compareRuns(before, after, { minWheelPowerW: -5, minWheelTorqueNm: null })).toThrow(/positive/);
  });
});

describe('compareBatteryRuns: capacity vs the brand threshold', () => {
  const battery = (ah: number) => {
    const I = ah / 2;
    const r = parseBatteryCsv(`time_s,voltage_v,current_a\n0,41,${I}\n7200,33,${I}\n`);
    if (r.status !== 'ok') throw new Error(r.status);
    return analyseBattery(r.run, { ratedCapacityAh: 14 });
  };
  it('before 9.8 Ah (70 %) is below an 80 % threshold; after 13.3 Ah (95 %) meets it', () => {
    const c = compareBatteryRuns(battery(9.8), battery(13.3), { thresholdPct: 80 });
    expect(c.before.status).toBe('below');
    expect(c.after.status).toBe('meets');
    expect(c.stateOfHealthPct.delta).toBeCloseTo(25, 9);
    expect(c.deliveredAh.delta).toBeCloseTo(3.5, 9);
    expect(c.repairVerified).toBe(true);
  });
});
