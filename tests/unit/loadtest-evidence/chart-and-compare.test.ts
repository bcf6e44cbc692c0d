import { describe, expect, it } from 'vitest';
import { analyseUpload, beforeAfter, chartRun, legalLimitForChart, runConditionNotes, type DynoSummary } from '@/lib/loadtest-evidence';
import { conditions, constantPowerCsv, dynoSpec, fixture } from './support';

const summary = (csv: string | Buffer): DynoSummary => {
  const r = analyseUpload(csv, { kind: 'dyno', spec: dynoSpec(), conditions: conditions() });
  if (r.status !== 'ok' || r.summary.kind !== 'dyno') throw new Error('expected a dyno summary');
  return r.summary;
};

describe('the chart’s data', () => {
  it('is the binned curve and the peaks in the reader’s units, whatever the number of samples', () => {
    const s = summary(fixture('dyno-mid-drive-metric.csv'));
    const m = chartRun(s.metric, 'metric');
    expect(m.points).toHaveLength(s.metric.bins.length);
    expect(m.points.length).toBeLessThan(40);
    const bin = s.metric.bins[10]!;
    expect(m.points[10]!.speed).toBeCloseTo(bin.meanSpeedMs * 3.6, 2);
    expect(m.points[10]!.power).toBeCloseTo(bin.power!.mean, 1);
    const i = chartRun(s.imperial, 'imperial');
    // NIST SP 811 B.8: mph = 0.447 04 m/s exactly; hp = 745.699 87 W; lbf·ft = 1.355 818 N·m.
    expect(i.peakPower.speed).toBeCloseTo(s.imperial.peakPower.speedMs / 0.44704, 2);
    expect(i.peakPower.power).toBeCloseTo(s.imperial.peakPower.watts / 745.69987158227022, 4);
    expect(i.peakTorque!.torque).toBeCloseTo(s.imperial.peakTorque!.nm / 1.3558179483314004, 2);
  });

  it('puts the class limit line where the regulation has it, in the reader’s speed unit', () => {
    // 25 km/h ÷ 1.609 344 km/h per mph (NIST SP 811, exact) = 15.53 mph; 28 mph = 45.06 km/h.
    expect(legalLimitForChart('eu-pedelec', 'imperial')).toBe(15.53);
    expect(legalLimitForChart('eu-pedelec', 'metric')).toBe(25);
    expect(legalLimitForChart('us-class-3', 'metric')).toBe(45.06);
    expect(legalLimitForChart(null, 'metric')).toBeNull();
  });
});

describe('before vs after', () => {
  const before = { summary: summary(constantPowerCsv(200)), conditions: conditions(), spec: dynoSpec() };
  const after = { summary: summary(constantPowerCsv(300)), conditions: conditions(), spec: dynoSpec() };

  it('deltas at the peaks and per speed step, and the after-run against the spec (closed form: 200 W → 300 W = +50 %)', () => {
    const c = beforeAfter(before, after, 'metric');
    if (c.kind !== 'dyno' || !c.runs) throw new Error('expected a dyno comparison');
    expect(c.runs.peakPowerW.deltaPct).toBeCloseTo(50, 9);
    expect(c.runs.bins.length).toBeGreaterThan(20);
    for (const b of c.runs.bins) expect(b.power!.deltaPct).toBeCloseTo(50, 6);
    expect(c.runs.repairVerified).toBe(true);
    expect(c.conditions.comparable).toBe(true);
  });

  it('runs under different conditions are not comparable, with the differences listed', () => {
    const c = beforeAfter({ ...before, conditions: conditions({ tyrePressurePa: 350_000, batterySocStartPct: 80 }) }, { ...after, conditions: conditions({ dynoId: 'Bench 2' }) }, 'metric');
    expect(c.conditions.comparable).toBe(false);
    expect(c.conditions.differences.join(' ')).toMatch(/Tyre pressure differs by 0\.50 bar/);
    expect(c.conditions.differences.join(' ')).toMatch(/Dyno differs: "Bench 1" before, "Bench 2" after/);
    expect(c.conditions.differences.join(' ')).toMatch(/Battery charge at start differs by 20 points/);
  });

  it('without a spec only the conditions are compared', () => {
    const none = dynoSpec({ minWheelPowerW: null, minWheelTorqueNm: null });
    const c = beforeAfter({ ...before, spec: none }, { ...after, spec: none }, 'metric');
    expect(c.runs).toBeNull();
    expect(c.conditions.comparable).toBe(true);
  });
});

describe('advice on one run’s conditions (common practice, no source)', () => {
  it('notes a battery not fully charged, a tyre off its sidewall maximum and a tyre not the bike’s own', () => {
    const notes = runConditionNotes(conditions({ batterySocStartPct: 80, tyrePressurePa: 300_000, tyreMaxPressurePa: 400_000, tyreSize: '57-622' }), 'metric', { kind: 'dyno', modelTyreSize: '50-622' });
    expect(notes).toEqual([
      'The battery was at 80 % at the start; charge it fully right before each run so before and after compare.',
      'The tyre was at 3.0 bar, below its sidewall maximum of 4.0 bar; inflate to the sidewall maximum for dyno runs.',
      'The run was recorded on a 57-622 tyre; the bike model is fitted with 50-622 from the factory.',
    ]);
    expect(runConditionNotes(conditions({ tyrePressurePa: 450_000 }), 'imperial', { kind: 'dyno' })[0]).toMatch(/above its sidewall maximum of 58 psi; never inflate beyond/);
    expect(runConditionNotes(conditions(), 'metric', { kind: 'dyno', modelTyreSize: '57-622' })).toEqual([]);
    expect(runConditionNotes(conditions({ tyrePressurePa: null }), 'metric', { kind: 'battery' })).toEqual([]);
  });
});
