import { mean, std } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  analyseDyno,
  analyseDynoCsv,
  MIN_SPEED_FOR_RATIO_MS,
  MOTOR_POWER_THRESHOLD_W,
  parseDynoCsv,
  powerFromTorque,
  POWER_TORQUE_TOLERANCE,
  wheelAngularSpeed,
  type DynoAnalysis,
  type DynoAnalysisOptions,
  type DynoRun,
} from '@/lib/loadtest';
import { isoCircumferenceM, MPH_MS } from '@/lib/units';
import { closedForm, DEFAULT_CURVE, samples, toImperialCsv, toMetricCsv } from './synthetic';

const C = DEFAULT_CURVE.circumferenceM;
const cf = closedForm();
const kmh = (ms: number) => ms * 3.6;

function run(text: string): DynoRun {
  const r = parseDynoCsv(text);
  if (r.status !== 'ok') throw new Error(JSON.stringify(r).slice(0, 500));
  return r.run;
}
const analyse = (text: string, o: Partial<DynoAnalysisOptions> = {}): DynoAnalysis =>
  analyseDyno(run(text), { circumferenceM: C, units: 'metric', ...o });

describe('synthetic curve with closed-form answers (P = a·v·(vmax − v), T = P·r/v)', () => {
  const clean = samples();
  const metric = analyse(toMetricCsv(clean));
  const imperial = analyse(toImperialCsv(clean));

  it('peak wheel power 500 W at vmax/2 = 16 km/h', () => {
    expect(metric.peakPower.watts).toBeCloseTo(cf.peakPowerW, 1);
    expect(kmh(metric.peakPower.speedMs)).toBeCloseTo(16, 1);
    expect(metric.basis).toEqual({ power: 'reported', torque: 'reported' });
  });

  it('power band where P ≥ 90 % of peak: vmax/2·(1 ± √0.1) = 10.94 … 21.06 km/h', () => {
    expect(kmh(metric.powerBand?.fromMs ?? NaN)).toBeCloseTo(kmh(cf.bandFromMs), 1);
    expect(kmh(metric.powerBand?.toMs ?? NaN)).toBeCloseTo(kmh(cf.bandToMs), 1);
    expect(metric.powerBand?.thresholdW).toBeCloseTo(450, 1);
  });

  it('peak wheel torque a·r·vmax at standstill', () => {
    // The first sample's centred window is one-sided (0 … 0.1 s), so it averages T over 0 … 0.2 km/h.
    expect(metric.peakTorque?.nm).toBeCloseTo(cf.torqueAt(0.1 / 3.6), 3);
    expect(metric.peakTorque?.row).toBe(2);
  });

  it('top speed vmax = 32 km/h; top speed with P > 30 W is the upper root of a·v·(vmax − v) = 30', () => {
    expect(kmh(metric.topSpeed.speedMs)).toBeCloseTo(32, 9);
    expect(kmh(metric.topSpeedUnderPower?.speedMs ?? NaN)).toBeCloseTo(kmh(cf.topSpeedAbove(MOTOR_POWER_THRESHOLD_W)), 1);
  });

  it('the same answers in SI from the imperial CSV (mph, lbf·ft, hp) as from the metric CSV', () => {
    expect(imperial.peakPower.watts).toBeCloseTo(metric.peakPower.watts, 6);
    expect(imperial.peakPower.speedMs).toBeCloseTo(metric.peakPower.speedMs, 9);
    expect(imperial.peakTorque?.nm).toBeCloseTo(metric.peakTorque?.nm ?? NaN, 6);
    expect(imperial.topSpeed.speedMs).toBeCloseTo(metric.topSpeed.speedMs, 9);
    expect(imperial.powerBand?.fromMs).toBeCloseTo(metric.powerBand?.fromMs ?? NaN, 6);
    expect(imperial.powerBand?.toMs).toBeCloseTo(metric.powerBand?.toMs ?? NaN, 6);
  });

  it('power agrees with torque × wheel angular speed: not flagged, implied circumference = the one given', () => {
    expect(metric.consistency?.flagged).toBe(false);
    expect(Math.abs(metric.consistency?.largest?.relative ?? 1)).toBeLessThan(1e-6);
    expect(metric.consistency?.impliedCircumferenceM).toBeCloseTo(C, 6);
  });

  it('1 km/h bins in metric and 1 mph bins in imperial, computed on SI data', () => {
    expect(metric.bins[0]).toMatchObject({ index: 0, unit: 'kmh', from: 0, to: 1 });
    expect(metric.bins.at(-1)?.index).toBe(32);
    const mph = analyseDyno(run(toMetricCsv(clean)), { circumferenceM: C, units: 'imperial' });
    expect(mph.bins.at(-1)?.index).toBe(Math.floor(cf.vmax / MPH_MS)); // 32 km/h = 19.88 mph
    expect(mph.bins[10]?.fromMs).toBeCloseTo(10 * MPH_MS, 12);
    expect(mph.bins.reduce((s, b) => s + b.count, 0)).toBe(clean.length);
  });
});

describe('the same curve with noise: answers within stated tolerances', () => {
  // σ = 2 % of peak power on power, 2 % of stall torque on torque, 0.05 km/h on speed.
  const noisy = samples(DEFAULT_CURVE, { seed: 7, powerSd: 10, torqueSd: 0.02 * cf.stallTorqueNm, speedSdKmh: 0.05 });
  const a = analyse(toMetricCsv(noisy));
  const b = analyse(toImperialCsv(noisy));

  it('peak power within 1 % of 500 W; its speed within 1.5 km/h of 16 km/h (the top of a parabola is flat)', () => {
    expect(Math.abs(a.peakPower.watts - 500) / 500).toBeLessThan(0.01);
    expect(Math.abs(kmh(a.peakPower.speedMs) - 16)).toBeLessThan(1.5);
  });

  it('power band edges within 0.3 km/h, top speed within 0.1 km/h', () => {
    expect(Math.abs(kmh(a.powerBand?.fromMs ?? NaN) - kmh(cf.bandFromMs))).toBeLessThan(0.3);
    expect(Math.abs(kmh(a.powerBand?.toMs ?? NaN) - kmh(cf.bandToMs))).toBeLessThan(0.3);
    expect(Math.abs(kmh(a.topSpeed.speedMs) - 32)).toBeLessThan(0.1);
  });

  it('peak torque within 1 % of stall torque, and metric and imperial files agree', () => {
    expect(Math.abs((a.peakTorque?.nm ?? 0) - cf.stallTorqueNm) / cf.stallTorqueNm).toBeLessThan(0.01);
    expect(b.peakPower.watts).toBeCloseTo(a.peakPower.watts, 6);
    expect(b.powerBand?.toMs).toBeCloseTo(a.powerBand?.toMs ?? NaN, 6);
  });

  it('bin mean and spread match mathjs mean and std (sample, n − 1) on the same samples', () => {
    const bin = a.bins.find((x) => x.index === 16);
    const inBin = noisy.filter((s) => Math.floor(s.v * 3.6 + 1e-9) === 16);
    expect(bin?.count).toBe(inBin.length);
    expect(bin?.power?.mean).toBeCloseTo(Number(mean(inBin.map((s) => s.power))), 6);
    expect(bin?.power?.std).toBeCloseTo(Number(std(inBin.map((s) => s.power))), 6);
    expect(bin?.torque?.min).toBeCloseTo(Math.min(...inBin.map((s) => s.torque)), 6);
    expect(bin?.torque?.max).toBeCloseTo(Math.max(...inBin.map((s) => s.torque)), 6);
  });

  it('noisy torque and power from independent sensors stay within the 5 % consistency tolerance', () => {
    expect(POWER_TORQUE_TOLERANCE).toBe(0.05);
    expect(a.consistency?.flagged).toBe(false);
  });
});

describe('deriving the missing one of torque and power from P = T·ω, ω = v/r', () => {
  const clean = samples();
  it('power only: torque derived; peak torque at the slowest derived speed (2 km/h)', () => {
    const a = analyse(toMetricCsv(clean, { power: true }));
    expect(a.basis).toEqual({ power: 'reported', torque: 'derived' });
    expect(a.consistency).toBeNull();
    expect(kmh(a.peakTorque?.speedMs ?? NaN)).toBeGreaterThanOrEqual(kmh(MIN_SPEED_FOR_RATIO_MS) - 1e-9);
    expect(a.peakTorque?.nm).toBeCloseTo(cf.torqueAt(MIN_SPEED_FOR_RATIO_MS), 1);
    expect(a.bins[0]?.torque).toBeNull(); // below 2 km/h torque is not derived
  });

  it('torque only: power derived; same peak power and band as the file with both', () => {
    const a = analyse(toMetricCsv(clean, { torque: true }));
    expect(a.basis).toEqual({ power: 'derived', torque: 'reported' });
    expect(a.peakPower.watts).toBeCloseTo(500, 1);
    expect(kmh(a.powerBand?.toMs ?? NaN)).toBeCloseTo(kmh(cf.bandToMs), 1);
  });

  it('derived power equals powerFromTorque(T, wheelAngularSpeed(v, C)) sample for sample', () => {
    const text = 'time_s,speed_kmh,wheel_torque_nm\n0,10,20\n1,20,20\n2,30,10\n';
    const a = analyseDyno(run(text), { circumferenceM: C, units: 'metric', smoothingWindowS: 0 });
    expect(a.peakPower.watts).toBeCloseTo(powerFromTorque(20, wheelAngularSpeed(20 / 3.6, C)), 9);
  });
});

describe('P = T·ω against published worked examples (Engineering Toolbox, "Angular Motion — Power and Torque")', () => {
  it('2000 W at 3600 rpm → T = 30P/(πn) = 5.305 N·m', async () => {
    const { rpmToRadS, torqueFromPower } = await import('@/lib/loadtest');
    expect(torqueFromPower(2000, rpmToRadS(3600))).toBeCloseTo(5.305, 3);
  });

  it('P(hp) = T(lbf·ft) × rpm / 5252 (5252 ≈ 33 000/2π, so agree to 1e-4)', async () => {
    const { rpmToRadS, powerFromTorque: p } = await import('@/lib/loadtest');
    const { HP_W, LBF_FT_NM } = await import('@/lib/units');
    for (const [lbft, rpm] of [[50, 3000], [63, 200], [10, 5252]] as const) {
      const hp = p(lbft * LBF_FT_NM, rpmToRadS(rpm)) / HP_W;
      expect(Math.abs(hp - (lbft * rpm) / 5252) / hp).toBeLessThan(1e-4);
    }
  });

  it('wheel rpm n = v·60/C: 25 km/h on a 2.3122 m wheel turns at 180.2 rpm', async () => {
    const { wheelRpm } = await import('@/lib/loadtest');
    expect(wheelRpm(25 / 3.6, isoCircumferenceM({ widthMm: 57, bsdMm: 622 }))).toBeCloseTo(180.2, 1);
  });
});

describe('power vs torque consistency flag (tolerance 5 %)', () => {
  const clean = samples();
  it('flags a power column computed for another wheel (57-559 entered as 57-622: 8.6 %) and names the implied circumference', () => {
    const other = isoCircumferenceM({ widthMm: 57, bsdMm: 559 });
    const a = analyse(toMetricCsv(clean), { circumferenceM: other });
    expect(a.consistency?.flagged).toBe(true);
    expect(a.consistency?.impliedCircumferenceM).toBeCloseTo(C, 6);
    expect(a.consistency?.message).toMatch(/wheel circumference of 2312 mm: check the tyre size/);
  });

  it('a 4 % circumference difference stays within tolerance', () => {
    const a = analyse(toMetricCsv(clean), { circumferenceM: C * 1.04 });
    expect(a.consistency?.flagged).toBe(false);
    expect(a.consistency?.largest?.relative).toBeCloseTo(0.04, 6);
  });

  it('flags edited power in part of the run and names the speed and line of the largest deviation', () => {
    const edited = clean.map((s, i) => (i >= 8000 && i < 9000 ? { ...s, power: s.power * 1.12 } : s));
    const a = analyse(toMetricCsv(edited));
    expect(a.consistency?.flagged).toBe(true);
    expect(a.consistency?.largest?.relative).toBeCloseTo(0.12, 2);
    const row = a.consistency?.largest?.row ?? 0;
    expect(row).toBeGreaterThanOrEqual(8002);
    expect(row).toBeLessThan(9002);
  });
});

describe('legal-class flag at and just beyond each limit', () => {
  /** A constant-speed run under 200 W of motor power. */
  const steady = (speed: number, col: 'speed_kmh' | 'speed_mph', watts = 200) =>
    `time_s,${col},wheel_power_w\n` + Array.from({ length: 50 }, (_, i) => `${i / 10},${speed},${watts}`).join('\n');
  const flag = (text: string, legalClass: DynoAnalysisOptions['legalClass']) =>
    analyseDynoCsv(text, { circumferenceM: C, units: 'metric', legalClass });
  const tampering = (text: string, legalClass: DynoAnalysisOptions['legalClass']) => {
    const r = flag(text, legalClass);
    if (r.status !== 'ok') throw new Error(r.status);
    return r.analysis.legal?.possibleTampering;
  };

  it('EU pedelec, 25 km/h (Regulation (EU) 168/2013 Art. 2(2)(h), EN 15194): 25.00 not over, 25.01 flagged', () => {
    expect(tampering(steady(25, 'speed_kmh'), 'eu-pedelec')).toBe(false);
    expect(tampering(steady(25.01, 'speed_kmh'), 'eu-pedelec')).toBe(true);
    expect(tampering(steady(15.534, 'speed_mph'), 'eu-pedelec')).toBe(false); // 15.534 mph = 24.9995 km/h
  });

  it('US class 1 and 2, 20 mph (36 CFR 1.4; 15 U.S.C. 2085): 20.00 not over, 20.01 flagged', () => {
    for (const c of ['us-class-1', 'us-class-2'] as const) {
      expect(tampering(steady(20, 'speed_mph'), c)).toBe(false);
      expect(tampering(steady(20.01, 'speed_mph'), c)).toBe(true);
      expect(tampering(steady(32.18688, 'speed_kmh'), c)).toBe(false); // exactly 20 mph written in km/h
    }
  });

  it('US class 3, 28 mph (36 CFR 1.4): 28.00 not over, 28.01 flagged', () => {
    expect(tampering(steady(28, 'speed_mph'), 'us-class-3')).toBe(false);
    expect(tampering(steady(28.01, 'speed_mph'), 'us-class-3')).toBe(true);
  });

  it('exceedsLimit: at the limit is not over; a trillionth beyond is float round-off, not over; a millionth beyond is over', async () => {
    const { exceedsLimit } = await import('@/lib/loadtest');
    const limit = 25 / 3.6;
    expect(exceedsLimit(limit, limit)).toBe(false);
    expect(exceedsLimit(limit * (1 + 1e-12), limit)).toBe(false);
    expect(exceedsLimit(limit * (1 + 1e-6), limit)).toBe(true);
  });

  it('only counts samples under motor power (> 30 W): coasting at 30 km/h with 30 W is not flagged, 31 W is', () => {
    expect(tampering(steady(30, 'speed_kmh', 30), 'eu-pedelec')).toBe(false);
    expect(tampering(steady(30, 'speed_kmh', 31), 'eu-pedelec')).toBe(true);
  });

  it('words the flag for review, never as a denial, and names the regulation', () => {
    const r = flag(steady(27.3, 'speed_kmh'), 'eu-pedelec');
    expect(r.status === 'ok' && r.analysis.legal?.message).toMatch(
      /^Possible limiter tampering: the top speed under motor power, 27\.30 km\/h, is above the 25 km\/h limit .*168\/2013.*no reason to deny/,
    );
  });

  it('no class given: no check', () => {
    const r = flag(steady(40, 'speed_kmh'), null);
    expect(r.status === 'ok' && r.analysis.legal).toBeNull();
  });
});

describe('analysis options are checked', () => {
  const r = run('time_s,speed_kmh,wheel_power_w\n0,1,1\n1,2,2\n');
  it('refuses a circumference that is not in metres', () => {
    expect(() => analyseDyno(r, { circumferenceM: 2312, units: 'metric' })).toThrow(/rolling circumference in metres/);
    expect(() => analyseDyno(r, { circumferenceM: NaN, units: 'metric' })).toThrow(RangeError);
  });
});
