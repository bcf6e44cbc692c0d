import type { UnitSystem } from '@/lib/units';
import { MIN_SPEED_FOR_RATIO_MS, MOTOR_POWER_THRESHOLD_W, POWER_BAND_FRACTION, SMOOTHING_WINDOW_S } from './analysis-constants';
import type { DynoRun } from './dyno-import';
import { checkLegalSpeed, type LegalClassId, type LegalSpeedCheck } from './legal-class';
import { checkPowerTorque, type PowerTorqueConsistency } from './power-consistency';
import { movingAverages } from './smoothing';
import { speedBins, type SpeedBin } from './speed-bins';

export interface DynoAnalysisOptions {
  /** Rolling circumference in metres (see `wheelCircumference` in lib/units). */
  readonly circumferenceM: number;
  /** Which bins to build: 1 km/h (metric) or 1 mph (imperial). */
  readonly units: UnitSystem;
  /** The class the bike is sold as; null or absent skips the check. */
  readonly legalClass?: LegalClassId | null;
  /** Moving-average window, s (default `SMOOTHING_WINDOW_S`). */
  readonly smoothingWindowS?: number;
}

/** Where in the run a value was found. */
export interface RunPoint {
  readonly speedMs: number;
  readonly timeS: number;
  /** 1-based file line. */
  readonly row: number;
}

export interface DynoAnalysis {
  readonly sampleCount: number;
  readonly durationS: number;
  readonly circumferenceM: number;
  readonly smoothingWindowS: number;
  /** Whether each quantity came from the file or from the other via P = T·v/r. */
  readonly basis: { readonly power: 'reported' | 'derived'; readonly torque: 'reported' | 'derived' };
  readonly peakPower: RunPoint & { readonly watts: number };
  /** Null only when torque is derived and no sample reached the slowest speed it is derived at. */
  readonly peakTorque: (RunPoint & { readonly nm: number }) | null;
  readonly topSpeed: RunPoint;
  /** Highest speed among samples with wheel power above `MOTOR_POWER_THRESHOLD_W`. */
  readonly topSpeedUnderPower: RunPoint | null;
  /** Speed range where power ≥ 90 % of peak (lowest and highest such sample). */
  readonly powerBand: { readonly fromMs: number; readonly toMs: number; readonly thresholdW: number } | null;
  readonly bins: readonly SpeedBin[];
  readonly binUnits: UnitSystem;
  /** Present when the file has both power and torque. */
  readonly consistency: PowerTorqueConsistency | null;
  readonly legal: LegalSpeedCheck | null;
}

/** Plausible wheel circumference bounds, m; outside them the caller passed millimetres or nothing useful. */
const CIRCUMFERENCE_RANGE_M = [0.3, 3.5] as const;

function argmax(a: Float64Array, include?: (i: number) => boolean): number {
  let best = -1;
  let bestV = -Infinity;
  for (let i = 0; i < a.length; i++) {
    const v = a[i] as number;
    if (v > bestV && (!include || include(i))) {
      bestV = v;
      best = i;
    }
  }
  return best;
}

/**
 * Analyse a dyno run: peaks, top speed, power band, speed-binned curve, power vs torque check and
 * legal-class speed check. Peaks, top speed and band use the smoothed signals; bins use raw samples.
 * Throws RangeError for options no caller should pass (a circumference that is not in metres).
 */
export function analyseDyno(run: DynoRun, options: DynoAnalysisOptions): DynoAnalysis {
  const C = options.circumferenceM;
  if (!Number.isFinite(C) || C < CIRCUMFERENCE_RANGE_M[0] || C > CIRCUMFERENCE_RANGE_M[1]) {
    throw new RangeError(`circumferenceM must be the wheel's rolling circumference in metres (${CIRCUMFERENCE_RANGE_M[0]}–${CIRCUMFERENCE_RANGE_M[1]}), got ${C}`);
  }
  const windowS = options.smoothingWindowS ?? SMOOTHING_WINDOW_S;
  if (!Number.isFinite(windowS) || windowS < 0) throw new RangeError(`smoothingWindowS must be ≥ 0 s, got ${windowS}`);
  const n = run.count;
  const r = C / (2 * Math.PI);
  // Local copies: module constants are getters once compiled to CommonJS, slow in per-sample loops.
  const minSpeed = MIN_SPEED_FOR_RATIO_MS;
  const motorThreshold = MOTOR_POWER_THRESHOLD_W;
  const { timeS: t, speedMs: v, lines } = run;

  // Power computed from torque per sample (T·v/r), smoothed like the rest: the basis when the file
  // has no power column, and what reported power is checked against when it has both.
  let torquePower: Float64Array | null = null;
  if (run.wheelTorqueNm) {
    const T = run.wheelTorqueNm;
    torquePower = new Float64Array(n);
    for (let i = 0; i < n; i++) torquePower[i] = (T[i] as number) * ((v[i] as number) / r);
  }
  const raw = [v];
  if (run.wheelPowerW) raw.push(run.wheelPowerW);
  if (run.wheelTorqueNm && torquePower) raw.push(run.wheelTorqueNm, torquePower);
  const smoothed = movingAverages(t, raw, windowS);
  const vs = smoothed[0] as Float64Array;
  const Ps = run.wheelPowerW ? (smoothed[1] as Float64Array) : null;
  const Ts = run.wheelTorqueNm ? (smoothed[raw.length - 2] as Float64Array) : null;
  const TPs = run.wheelTorqueNm ? (smoothed[raw.length - 1] as Float64Array) : null;

  // Whichever of power and torque the file lacks comes from the other: P = T·v/r.
  const power = (Ps ?? TPs) as Float64Array;
  const rawPower = (run.wheelPowerW ?? torquePower) as Float64Array;
  let torque: Float64Array;
  let rawTorque: Float64Array;
  if (Ts && run.wheelTorqueNm) {
    torque = Ts;
    rawTorque = run.wheelTorqueNm;
  } else {
    // Torque from power is taken on the smoothed signals: dividing raw power by a raw, noisy speed near the slowest speed would amplify noise.
    torque = new Float64Array(n);
    rawTorque = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const sv = vs[i] as number;
      const rv = v[i] as number;
      torque[i] = sv >= minSpeed ? (power[i] as number) * (r / sv) : NaN;
      rawTorque[i] = rv >= minSpeed ? (rawPower[i] as number) * (r / rv) : NaN;
    }
  }

  const point = (i: number): RunPoint => ({ speedMs: vs[i] as number, timeS: t[i] as number, row: lines[i] as number });

  const pi = argmax(power);
  const peakPower = { ...point(pi), watts: power[pi] as number };
  const ti = argmax(torque);
  const peakTorque = ti === -1 ? null : { ...point(ti), nm: torque[ti] as number };
  const topSpeed = point(argmax(vs));
  const ui = argmax(vs, (i) => (power[i] as number) > motorThreshold);
  const topSpeedUnderPower = ui === -1 ? null : point(ui);

  let powerBand: DynoAnalysis['powerBand'] = null;
  if (peakPower.watts > 0) {
    const thresholdW = POWER_BAND_FRACTION * peakPower.watts;
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < n; i++) {
      if ((power[i] as number) >= thresholdW) {
        const s = vs[i] as number;
        if (s < lo) lo = s;
        if (s > hi) hi = s;
      }
    }
    powerBand = { fromMs: lo, toMs: hi, thresholdW };
  }

  const consistency =
    Ps && TPs ? checkPowerTorque(vs, Ps, TPs, lines, C, peakPower.watts, options.units) : null;
  const legal = options.legalClass ? checkLegalSpeed(topSpeedUnderPower?.speedMs ?? null, options.legalClass) : null;

  return {
    sampleCount: n,
    durationS: (t[n - 1] as number) - (t[0] as number),
    circumferenceM: C,
    smoothingWindowS: windowS,
    basis: { power: run.wheelPowerW ? 'reported' : 'derived', torque: run.wheelTorqueNm ? 'reported' : 'derived' },
    peakPower,
    peakTorque,
    topSpeed,
    topSpeedUnderPower,
    powerBand,
    bins: speedBins(v, rawPower, rawTorque, options.units),
    binUnits: options.units,
    consistency,
    legal,
  };
}
