import type { UnitSystem } from '@/lib/units';
import { BIN_WIDTH_MS } from './analysis-constants';

/** Mean and spread of one quantity in one bin. `std` is the sample standard deviation (n − 1); 0 for one sample. */
export interface BinStats {
  readonly count: number;
  readonly mean: number;
  readonly std: number;
  readonly min: number;
  readonly max: number;
}

/** One speed bin: [from, to) in the display unit (1 km/h or 1 mph wide), computed on SI data. */
export interface SpeedBin {
  readonly index: number;
  readonly unit: 'kmh' | 'mph';
  /** Lower edge in the display unit (= index). */
  readonly from: number;
  readonly to: number;
  readonly fromMs: number;
  readonly toMs: number;
  readonly count: number;
  readonly meanSpeedMs: number;
  /** Wheel power, W. */
  readonly power: BinStats | null;
  /** Wheel torque, N·m (samples below the slowest speed for derived torque are left out when torque is derived). */
  readonly torque: BinStats | null;
}

/** Float round-off allowance when a speed sits exactly on a bin edge (e.g. 5 km/h stored as 5/3.6 m/s). */
const EDGE_EPSILON = 1e-9;

/** Bin index of an SI speed for a unit system. */
export function binIndex(speedMs: number, system: UnitSystem): number {
  return Math.floor(speedMs / BIN_WIDTH_MS[system] + EDGE_EPSILON);
}

class Welford {
  count: Float64Array;
  mean: Float64Array;
  m2: Float64Array;
  min: Float64Array;
  max: Float64Array;
  constructor(size: number) {
    this.count = new Float64Array(size);
    this.mean = new Float64Array(size);
    this.m2 = new Float64Array(size);
    this.min = new Float64Array(size).fill(Infinity);
    this.max = new Float64Array(size).fill(-Infinity);
  }
  add(b: number, x: number): void {
    const n = (this.count[b] as number) + 1;
    this.count[b] = n;
    const mean = this.mean[b] as number;
    const d = x - mean;
    const m = mean + d / n;
    this.mean[b] = m;
    this.m2[b] = (this.m2[b] as number) + d * (x - m);
    if (x < (this.min[b] as number)) this.min[b] = x;
    if (x > (this.max[b] as number)) this.max[b] = x;
  }
  stats(b: number): BinStats | null {
    const n = this.count[b] as number;
    if (n === 0) return null;
    return {
      count: n,
      mean: this.mean[b] as number,
      std: n > 1 ? Math.sqrt((this.m2[b] as number) / (n - 1)) : 0,
      min: this.min[b] as number,
      max: this.max[b] as number,
    };
  }
}

/**
 * Speed-binned curve of raw (unsmoothed) samples, so the spread shows the run's real scatter.
 * Only bins that hold samples are returned, slowest first. NaN torque values are skipped.
 */
export function speedBins(speedMs: Float64Array, powerW: Float64Array | null, torqueNm: Float64Array | null, system: UnitSystem): SpeedBin[] {
  const n = speedMs.length;
  const width = BIN_WIDTH_MS[system];
  const eps = EDGE_EPSILON;
  const index = new Int32Array(n);
  let maxIndex = 0;
  for (let i = 0; i < n; i++) {
    // Same rule as binIndex(), inlined for the per-sample loop.
    const b = Math.floor((speedMs[i] as number) / width + eps);
    index[i] = b;
    if (b > maxIndex) maxIndex = b;
  }
  const size = maxIndex + 1;
  const counts = new Float64Array(size);
  const speedSum = new Float64Array(size);
  const power = powerW ? new Welford(size) : null;
  const torque = torqueNm ? new Welford(size) : null;
  for (let i = 0; i < n; i++) {
    const v = speedMs[i] as number;
    const b = index[i] as number;
    counts[b] = (counts[b] as number) + 1;
    speedSum[b] = (speedSum[b] as number) + v;
    if (power && powerW) power.add(b, powerW[i] as number);
    if (torque && torqueNm) {
      const t = torqueNm[i] as number;
      if (t === t) torque.add(b, t);
    }
  }
  const unit = system === 'metric' ? 'kmh' : 'mph';
  const bins: SpeedBin[] = [];
  for (let b = 0; b < size; b++) {
    const count = counts[b] as number;
    if (count === 0) continue;
    bins.push({
      index: b,
      unit,
      from: b,
      to: b + 1,
      fromMs: b * width,
      toMs: (b + 1) * width,
      count,
      meanSpeedMs: (speedSum[b] as number) / count,
      power: power ? power.stats(b) : null,
      torque: torque ? torque.stats(b) : null,
    });
  }
  return bins;
}
