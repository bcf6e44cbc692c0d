import { formatLength, formatSpeed, type UnitSystem } from '@/lib/units';
import { CONSISTENCY_MIN_POWER_FRACTION, MIN_SPEED_FOR_RATIO_MS, MOTOR_POWER_THRESHOLD_W, POWER_TORQUE_TOLERANCE } from './analysis-constants';
import { medianInPlace } from './select';

export interface PowerTorqueConsistency {
  readonly tolerance: number;
  readonly samplesCompared: number;
  /** Largest |reported − computed| / computed, with where it happened; null when no sample qualified. */
  readonly largest: {
    readonly relative: number;
    readonly speedMs: number;
    readonly row: number;
    readonly reportedW: number;
    readonly computedW: number;
  } | null;
  /** Median of reported ÷ computed power. */
  readonly medianRatio: number | null;
  /** The circumference the power column agrees with: a wrong tyre entry shows up here. */
  readonly impliedCircumferenceM: number | null;
  readonly flagged: boolean;
  readonly message: string;
}

/**
 * Compare reported wheel power with torque × wheel angular speed (P = T·ω, ω = v/r = 2πv/C), both
 * smoothed alike. `computedW` is T·v/r per sample for `circumferenceM`, then smoothed. Only samples
 * at or above the slowest compared speed and at or above half of peak power count.
 */
export function checkPowerTorque(
  speedMs: Float64Array,
  reportedW: Float64Array,
  computedW: Float64Array,
  lines: Int32Array,
  circumferenceM: number,
  peakPowerW: number,
  system: UnitSystem,
): PowerTorqueConsistency {
  const n = speedMs.length;
  const minPower = Math.max(MOTOR_POWER_THRESHOLD_W, CONSISTENCY_MIN_POWER_FRACTION * peakPowerW);
  const minSpeed = MIN_SPEED_FOR_RATIO_MS;
  const ratios = new Float64Array(n);
  let m = 0;
  let worst = -1;
  let worstDev = 0;
  for (let i = 0; i < n; i++) {
    const v = speedMs[i] as number;
    const p = reportedW[i] as number;
    if (v < minSpeed || p < minPower) continue;
    const computed = computedW[i] as number;
    if (!(computed > 0)) continue;
    const ratio = p / computed;
    ratios[m++] = ratio;
    const dev = Math.abs(ratio - 1);
    if (dev > worstDev || worst === -1) {
      worstDev = dev;
      worst = i;
    }
  }
  const tolerancePct = `${(POWER_TORQUE_TOLERANCE * 100).toFixed(0)} %`;
  const pct = (x: number) => `${(Math.abs(x) < 0.0005 ? 0 : x * 100).toFixed(1)} %`;
  if (m === 0 || worst === -1) {
    return {
      tolerance: POWER_TORQUE_TOLERANCE,
      samplesCompared: 0,
      largest: null,
      medianRatio: null,
      impliedCircumferenceM: null,
      flagged: false,
      message: 'No sample had enough speed and power to compare reported power with torque × wheel speed.',
    };
  }
  const median = medianInPlace(ratios, m);
  const computed = computedW[worst] as number;
  const reported = reportedW[worst] as number;
  const relative = (reported - computed) / computed;
  const flagged = Math.abs(relative) > POWER_TORQUE_TOLERANCE;
  const implied = circumferenceM / median;
  const at = formatSpeed(speedMs[worst] as number, system).text;
  const message = flagged
    ? `Reported power and torque × wheel speed differ by up to ${pct(relative)} (at ${at}, line ${lines[worst]}), more than the ${tolerancePct} allowed. The power column agrees best with a wheel circumference of ${formatLength(implied, system).text}: check the tyre size, or whether the data was edited.`
    : `Reported power agrees with torque × wheel speed within ${tolerancePct} (largest difference ${pct(relative)} at ${at}).`;
  return {
    tolerance: POWER_TORQUE_TOLERANCE,
    samplesCompared: m,
    largest: { relative, speedMs: speedMs[worst] as number, row: lines[worst] as number, reportedW: reported, computedW: computed },
    medianRatio: median,
    impliedCircumferenceM: implied,
    flagged,
    message,
  };
}
