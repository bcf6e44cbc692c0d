/**
 * Synthetic dyno runs whose answers are known in closed form, for the analysis tests.
 *
 * Power at the wheel P(v) = a·v·(vmax − v) (v in m/s): a parabola with its peak Pmax = a·vmax²/4 at
 * vmax/2, power ≥ 90 % of peak for v in vmax/2·(1 ± √0.1), and torque T = P·r/v = a·r·(vmax − v),
 * falling straight from a·r·vmax at standstill. The run ramps speed linearly from 0 to vmax under
 * power, holds vmax for 1 s with no power, then coasts to a stop.
 */
import { HP_W, LBF_FT_NM, MPH_MS } from '@/lib/units';

export interface CurveParams {
  readonly vmaxKmh: number;
  readonly peakPowerW: number;
  readonly circumferenceM: number;
  readonly rampS: number;
  readonly rateHz: number;
}

export const DEFAULT_CURVE: CurveParams = {
  vmaxKmh: 32,
  peakPowerW: 500,
  circumferenceM: (Math.PI * (622 + 2 * 57)) / 1000,
  rampS: 16,
  rateHz: 1000,
};

export function closedForm(p: CurveParams = DEFAULT_CURVE) {
  const vmax = p.vmaxKmh / 3.6;
  const a = (4 * p.peakPowerW) / (vmax * vmax);
  const r = p.circumferenceM / (2 * Math.PI);
  return {
    vmax,
    a,
    r,
    peakPowerW: p.peakPowerW,
    peakPowerSpeedMs: vmax / 2,
    bandFromMs: (vmax / 2) * (1 - Math.sqrt(0.1)),
    bandToMs: (vmax / 2) * (1 + Math.sqrt(0.1)),
    /** Torque at standstill. */
    stallTorqueNm: a * r * vmax,
    torqueAt: (v: number) => a * r * (vmax - v),
    powerAt: (v: number) => a * v * (vmax - v),
    /** Highest speed with P > threshold: the upper root of a·v·(vmax − v) = threshold. */
    topSpeedAbove: (thresholdW: number) => (vmax + Math.sqrt(vmax * vmax - (4 * thresholdW) / a)) / 2,
  };
}

/** Deterministic standard normal noise (LCG + Box–Muller), so noisy tests are repeatable. */
export function gaussian(seed: number): () => number {
  let s = seed >>> 0;
  const uniform = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}

export interface Sample {
  t: number;
  v: number;
  torque: number;
  power: number;
}

export function samples(p: CurveParams = DEFAULT_CURVE, noise?: { seed: number; powerSd: number; torqueSd: number; speedSdKmh: number }): Sample[] {
  const cf = closedForm(p);
  const out: Sample[] = [];
  const g = noise ? gaussian(noise.seed) : () => 0;
  const dt = 1 / p.rateHz;
  const holdS = 1;
  const coastS = 4;
  const total = Math.round((p.rampS + holdS + coastS) * p.rateHz);
  for (let i = 0; i <= total; i++) {
    const t = i * dt;
    let v: number;
    let powered: boolean;
    if (t <= p.rampS) {
      v = (cf.vmax * t) / p.rampS;
      powered = true;
    } else if (t <= p.rampS + holdS) {
      v = cf.vmax;
      powered = false;
    } else {
      v = Math.max(0, cf.vmax * (1 - (t - p.rampS - holdS) / coastS));
      powered = false;
    }
    let torque = powered ? cf.torqueAt(v) : 0;
    let power = powered ? cf.powerAt(v) : 0;
    if (noise) {
      v = Math.max(0, v + (noise.speedSdKmh / 3.6) * g());
      torque = Math.max(0, torque + noise.torqueSd * g());
      power = Math.max(0, power + noise.powerSd * g());
    }
    out.push({ t, v, torque, power });
  }
  return out;
}

/** 12 significant digits: enough that a CSV round trip changes nothing we test. */
const num = (x: number) => Number(x.toPrecision(12)).toString();

export function toMetricCsv(rows: readonly Sample[], columns: { torque?: boolean; power?: boolean } = { torque: true, power: true }): string {
  const head = ['time_s', 'speed_kmh', ...(columns.torque ? ['wheel_torque_nm'] : []), ...(columns.power ? ['wheel_power_w'] : [])];
  const lines = rows.map((s) => [num(s.t), num(s.v * 3.6), ...(columns.torque ? [num(s.torque)] : []), ...(columns.power ? [num(s.power)] : [])].join(','));
  return [head.join(','), ...lines].join('\n') + '\n';
}

export function toImperialCsv(rows: readonly Sample[]): string {
  const lines = rows.map((s) => [num(s.t), num(s.v / MPH_MS), num(s.torque / LBF_FT_NM), num(s.power / HP_W)].join(','));
  return ['time_s,speed_mph,wheel_torque_lbft,wheel_power_hp', ...lines].join('\n') + '\n';
}
