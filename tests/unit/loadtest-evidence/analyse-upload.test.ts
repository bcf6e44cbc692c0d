import { describe, expect, it } from 'vitest';
import { analyseDynoCsv } from '@/lib/loadtest';
import { analyseUpload, runVerdict, type DynoSummary, type LoadTestSpec } from '@/lib/loadtest-evidence';
import { MPH_MS } from '@/lib/units';
import { conditions, constantPowerCsv, dynoSpec, fixture, R_57_622 } from './support';

const dyno = (input: string | Buffer, spec: LoadTestSpec = dynoSpec(), c = conditions()) => {
  const r = analyseUpload(input, { kind: 'dyno', spec, conditions: c });
  if (r.status !== 'ok') throw new Error(JSON.stringify(r));
  return r as Extract<typeof r, { status: 'ok' }> & { summary: DynoSummary };
};

describe('a dyno upload is analysed into a stored summary and a verdict', () => {
  it('at the part’s minimum counts as meeting it; just under it is below by the exact share (closed form: constant 300 W)', () => {
    const at = dyno(constantPowerCsv(300));
    expect(at.summary.metric.peakPower.watts).toBe(300);
    expect(at.verdict).toMatchObject({ kind: 'dyno', meets: true });
    const under = dyno(constantPowerCsv(270));
    expect(under.verdict.meets).toBe(false);
    const v = runVerdict(under.summary, dynoSpec({ minWheelTorqueNm: null }), 'metric');
    if (v.kind !== 'dyno' || v.check.power.status !== 'below') throw new Error('expected below');
    // (300 − 270) / 300 = 10 %.
    expect(v.check.power.belowByPct).toBeCloseTo(10, 12);
    expect(v.message).toBe('Below by 10.0 %: peak wheel power 270 W < 300 W.');
  });

  it('without a minimum in the catalog there is no automatic pass', () => {
    const r = dyno(constantPowerCsv(500), dynoSpec({ minWheelPowerW: null, minWheelTorqueNm: null }));
    expect(r.verdict).toMatchObject({ kind: 'no-spec', meets: false });
  });

  it('bins the curve per 1 km/h and per 1 mph from the same samples; peaks are the same SI values', () => {
    const r = dyno(fixture('dyno-mid-drive-metric.csv'));
    const { metric, imperial } = r.summary;
    expect(imperial.peakPower).toEqual(metric.peakPower);
    expect(imperial.peakTorque).toEqual(metric.peakTorque);
    expect(metric.bins[1]!.toMs - metric.bins[1]!.fromMs).toBeCloseTo(1 / 3.6, 12);
    // 1 mph = 0.447 04 m/s exactly (NIST SP 811 B.8).
    expect(imperial.bins[1]!.toMs - imperial.bins[1]!.fromMs).toBeCloseTo(MPH_MS, 12);
    expect(r.columnMapping).toEqual({
      time_s: { quantity: 'time', unit: 's' }, speed_kmh: { quantity: 'speed', unit: 'kmh' },
      wheel_torque_nm: { quantity: 'wheelTorque', unit: 'nm' }, wheel_power_w: { quantity: 'wheelPower', unit: 'w' },
    });
    expect(r.sampleCount).toBe(metric.sampleCount);
  });

  it('the curve leaves out the run-down, so it does not average zeros into the sweep', () => {
    // The fixture: a 20 s sweep to 27 km/h at 50 Hz, then 5 s of run-down with no torque (tests/fixtures/loadtest/generate.ts).
    const r = dyno(fixture('dyno-mid-drive-metric.csv'));
    expect(r.summary.curve.samplesLeftOut).toBeGreaterThan(240);
    expect(r.summary.curve.samplesLeftOut).toBeLessThan(260);
    const whole = analyseDynoCsv(fixture('dyno-mid-drive-metric.csv'), { circumferenceM: r.summary.metric.circumferenceM, units: 'metric' });
    if (whole.status !== 'ok') throw new Error('fixture did not read');
    const at20 = (bins: typeof whole.analysis.bins) => bins.find((b) => b.from === 20)!.power!.mean;
    // Left in, about 9 run-down samples at 0 W join about 37 sweep samples in each 1 km/h step: ≈ 20 % lower.
    expect(at20(whole.analysis.bins) / at20(r.summary.metric.bins)).toBeGreaterThan(0.75);
    expect(at20(whole.analysis.bins) / at20(r.summary.metric.bins)).toBeLessThan(0.85);
    // The peaks are the library's, over the whole file.
    expect(r.summary.metric.peakPower).toEqual(whole.analysis.peakPower);
  });

  it('leaves out every run-down of a log with several sweeps, and keeps a power collapse during a sweep', () => {
    // Two sweeps 2 → 25 km/h in 10 s at a constant 300 W, each followed by a 3 s run-down at 0 W, at 50 Hz.
    const lines = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
    let t = 0;
    const row = (kmh: number, w: number) => lines.push(`${(t++ * 0.02).toFixed(2)},${kmh.toFixed(4)},${(w / Math.max(kmh / 3.6 / R_57_622, 1e-9)).toFixed(5)},${w}`);
    for (let sweep = 0; sweep < 2; sweep++) {
      for (let i = 0; i < 500; i++) row(2 + (23 * i) / 500, 300);
      for (let i = 0; i < 150; i++) row(25 - (23 * i) / 150, 0);
    }
    const r = dyno(lines.join('\n') + '\n');
    expect(r.summary.curve.samplesLeftOut).toBeGreaterThan(270);
    // 2 × 150 run-down samples, give or take the few the 0.2 s moving average smears across each turn-round.
    expect(r.summary.curve.samplesLeftOut).toBeLessThan(310);
    for (const b of r.summary.metric.bins.filter((b) => b.from >= 4 && b.from <= 23)) expect(b.power!.mean).toBeGreaterThan(295);

    // A sweep whose power drops to nothing above 15 km/h while the roller keeps accelerating: that is the fault, and it stays in the curve.
    const fault = ['time_s,speed_kmh,wheel_power_w'];
    for (let i = 0; i < 1000; i++) {
      const kmh = 2 + (23 * i) / 1000;
      fault.push(`${(i * 0.02).toFixed(2)},${kmh.toFixed(4)},${kmh < 15 ? 300 : 0}`);
    }
    const f = dyno(fault.join('\n') + '\n');
    expect(f.summary.curve.samplesLeftOut).toBe(0);
    expect(f.summary.metric.bins.find((b) => b.from === 20)!.power!.mean).toBe(0);
  });

  it('needs the wheel circumference: a tyre size or a measured roll-out, the roll-out winning', () => {
    const none = analyseUpload(constantPowerCsv(300), { kind: 'dyno', spec: dynoSpec(), conditions: conditions({ tyreSize: null }) });
    expect(none).toMatchObject({ status: 'conditions', field: 'tyreSize' });
    const measured = dyno(constantPowerCsv(300), dynoSpec(), conditions({ measuredCircumferenceMm: 2290 }));
    expect(measured.summary.metric.circumferenceM).toBe(2.29);
    expect(measured.summary.circumference).toMatchObject({ source: 'measured', tyreIso: '57-622' });
  });

  it('flags a run past the legal class for the rep: the EU pedelec’s 25 km/h (Regulation (EU) 168/2013), not US class 3’s 28 mph (36 CFR 1.4)', () => {
    const eu = dyno(fixture('dyno-limiter-defeated.csv'), dynoSpec({ legalClass: 'eu-pedelec' }));
    expect(eu.summary.metric.legal).toMatchObject({ possibleTampering: true });
    const us3 = dyno(fixture('dyno-limiter-defeated.csv'), dynoSpec({ legalClass: 'us-class-3' }));
    expect(us3.summary.metric.legal).toMatchObject({ possibleTampering: false });
    // The flag never decides: the verdict is about the spec only.
    expect(eu.verdict.meets).toBe(us3.verdict.meets);
  });

  it('passes the mapping question through, and reads the file once it is answered', () => {
    const asked = analyseUpload(fixture('dyno-needs-mapping.csv'), { kind: 'dyno', spec: dynoSpec(), conditions: conditions() });
    expect(asked).toMatchObject({ status: 'needs-mapping', kind: 'dyno' });
    if (asked.status !== 'needs-mapping') return;
    const answered = analyseUpload(fixture('dyno-needs-mapping.csv'), {
      kind: 'dyno', spec: dynoSpec(), conditions: conditions(), mapping: { ...asked.proposedMapping, 'Motor temp [°C]': { quantity: 'ignore' } },
    });
    expect(answered.status).toBe('ok');
    if (answered.status === 'ok') expect(answered.signature).toBe(asked.signature);
  });
});

describe('a battery upload', () => {
  const spec = (thresholdPct: number | null): LoadTestSpec => ({ kind: 'battery', ratedCapacityAh: 14, nominalVoltageV: 36, thresholdPct, partNumber: 'B' });
  /** Constant 5 A for 2 h at a linear 40 → 32 V: ∫I dt = 10 Ah, ∫V·I dt = 5 × 36 × 2 = 360 Wh exactly. */
  const constant = () => {
    const lines = ['time_s,voltage_v,current_a'];
    for (let t = 0; t <= 7200; t += 60) lines.push(`${t},${(40 - (8 * t) / 7200).toFixed(6)},5`);
    return lines.join('\n') + '\n';
  };

  it('delivered Ah and Wh by the trapezoidal rule, state of health and the verdict against the threshold', () => {
    const r = analyseUpload(constant(), { kind: 'battery', spec: spec(70), conditions: conditions() });
    if (r.status !== 'ok' || r.summary.kind !== 'battery') throw new Error('expected a battery summary');
    expect(r.summary.analysis.deliveredAh).toBeCloseTo(10, 9);
    expect(r.summary.analysis.deliveredWh).toBeCloseTo(360, 6);
    // 10 / 14 = 71.43 % of rated: meets 70 %, below 75 % by 3.57 points.
    expect(r.summary.analysis.stateOfHealthPct).toBeCloseTo(71.428571, 5);
    expect(r.verdict).toMatchObject({ kind: 'battery', meets: true });
    const strict = runVerdict(r.summary, spec(75), 'metric');
    expect(strict).toMatchObject({ kind: 'battery', meets: false });
    if (strict.kind === 'battery' && strict.check.status === 'below') expect(strict.check.belowByPoints).toBeCloseTo(3.571429, 5);
    // Rated energy Wh = V × Ah (49 CFR 171.8): 36 V × 14 Ah = 504 Wh.
    expect(r.summary.analysis.ratedEnergyWh).toBe(504);
    expect(runVerdict(r.summary, spec(null), 'metric')).toMatchObject({ kind: 'no-spec', meets: false });
  });
});
