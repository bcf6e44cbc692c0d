import { formatPower, formatTorque, type UnitSystem } from '@/lib/units';
import type { BatteryAnalysis, CapacityVerdict } from './battery-analysis';
import { capacityVerdict } from './battery-analysis';
import { compareConditions, type ConditionsComparison, type TestConditions } from './conditions';
import type { DynoAnalysis } from './dyno-analysis';

/** The part's minimum performance, measured at the wheel (the same basis as the dyno). */
export interface PartSpec {
  readonly minWheelPowerW: number | null;
  readonly minWheelTorqueNm: number | null;
}

export type SpecVerdict =
  | { readonly status: 'meets'; readonly measured: number; readonly minimum: number; readonly message: string }
  | { readonly status: 'below'; readonly measured: number; readonly minimum: number; readonly belowByPct: number; readonly message: string }
  | { readonly status: 'not-specified'; readonly message: string }
  | { readonly status: 'not-measured'; readonly minimum: number; readonly message: string };

export interface SpecCheck {
  readonly power: SpecVerdict;
  readonly torque: SpecVerdict;
  /** Every minimum the spec sets is met. */
  readonly meets: boolean;
}

export interface Delta {
  readonly before: number;
  readonly after: number;
  /** after − before */
  readonly delta: number;
  /** (after − before) ÷ before × 100; null when before is 0. */
  readonly deltaPct: number | null;
}

export interface BinDelta {
  readonly index: number;
  readonly from: number;
  readonly to: number;
  readonly unit: 'kmh' | 'mph';
  /** Mean wheel power in the bin, W. */
  readonly power: Delta | null;
  /** Mean wheel torque in the bin, N·m. */
  readonly torque: Delta | null;
}

export interface RunComparison {
  readonly peakPowerW: Delta;
  readonly peakTorqueNm: Delta | null;
  readonly topSpeedMs: Delta;
  readonly powerBandFromMs: Delta | null;
  readonly powerBandToMs: Delta | null;
  /** Bins present in both runs, slowest first. */
  readonly bins: readonly BinDelta[];
  /** Bin indices only one run reached. */
  readonly binsOnlyBefore: readonly number[];
  readonly binsOnlyAfter: readonly number[];
  readonly before: SpecCheck;
  readonly after: SpecCheck;
  /** The after-run decides: it meets every minimum in the spec. A rep may still accept by hand. */
  readonly repairVerified: boolean;
  readonly conditions: ConditionsComparison | null;
}

function delta(before: number, after: number): Delta {
  return { before, after, delta: after - before, deltaPct: before !== 0 ? ((after - before) / before) * 100 : null };
}

function verdict(measured: number | null, minimum: number | null, what: string, show: (x: number) => string): SpecVerdict {
  if (minimum === null) return { status: 'not-specified', message: `The part's spec sets no minimum ${what}.` };
  if (measured === null) return { status: 'not-measured', minimum, message: `The run gives no ${what} to compare with the ${show(minimum)} minimum.` };
  if (measured >= minimum) return { status: 'meets', measured, minimum, message: `Meets: ${what} ${show(measured)} ≥ ${show(minimum)}.` };
  const belowByPct = ((minimum - measured) / minimum) * 100;
  return { status: 'below', measured, minimum, belowByPct, message: `Below by ${belowByPct.toFixed(1)} %: ${what} ${show(measured)} < ${show(minimum)}.` };
}

function validateSpec(spec: PartSpec): void {
  const ok = (v: number | null) => v === null || (Number.isFinite(v) && v > 0);
  if (!ok(spec.minWheelPowerW) || !ok(spec.minWheelTorqueNm)) throw new RangeError('Part spec minimums must be positive numbers or null');
  if (spec.minWheelPowerW === null && spec.minWheelTorqueNm === null) throw new RangeError('Part spec needs a minimum wheel power or a minimum wheel torque');
}

/** Check one run's peaks against the part's spec. At the minimum = meets. */
export function checkAgainstSpec(analysis: DynoAnalysis, spec: PartSpec, system: UnitSystem = 'metric'): SpecCheck {
  validateSpec(spec);
  const power = verdict(analysis.peakPower.watts, spec.minWheelPowerW, 'peak wheel power', (x) => formatPower(x, system).text);
  const torque = verdict(analysis.peakTorque?.nm ?? null, spec.minWheelTorqueNm, 'peak wheel torque', (x) => formatTorque(x, system).text);
  const meets = [power, torque].every((v) => v.status === 'meets' || v.status === 'not-specified');
  return { power, torque, meets };
}

/**
 * Before vs after a repair: deltas at the peaks and per speed bin, each run against the part's
 * spec, and (when given) the test conditions compared. Both analyses must use the same bins.
 */
export function compareRuns(
  before: DynoAnalysis,
  after: DynoAnalysis,
  spec: PartSpec,
  options: { conditions?: { before: TestConditions; after: TestConditions } | null; units?: UnitSystem } = {},
): RunComparison {
  if (before.binUnits !== after.binUnits) {
    throw new RangeError(`Both runs must be binned in the same units (before: ${before.binUnits}, after: ${after.binUnits})`);
  }
  const system = options.units ?? before.binUnits;
  const afterBins = new Map(after.bins.map((b) => [b.index, b]));
  const beforeIdx = new Set(before.bins.map((b) => b.index));
  const bins: BinDelta[] = [];
  for (const b of before.bins) {
    const a = afterBins.get(b.index);
    if (!a) continue;
    bins.push({
      index: b.index,
      from: b.from,
      to: b.to,
      unit: b.unit,
      power: b.power && a.power ? delta(b.power.mean, a.power.mean) : null,
      torque: b.torque && a.torque ? delta(b.torque.mean, a.torque.mean) : null,
    });
  }
  const beforeCheck = checkAgainstSpec(before, spec, system);
  const afterCheck = checkAgainstSpec(after, spec, system);
  return {
    peakPowerW: delta(before.peakPower.watts, after.peakPower.watts),
    peakTorqueNm: before.peakTorque && after.peakTorque ? delta(before.peakTorque.nm, after.peakTorque.nm) : null,
    topSpeedMs: delta(before.topSpeed.speedMs, after.topSpeed.speedMs),
    powerBandFromMs: before.powerBand && after.powerBand ? delta(before.powerBand.fromMs, after.powerBand.fromMs) : null,
    powerBandToMs: before.powerBand && after.powerBand ? delta(before.powerBand.toMs, after.powerBand.toMs) : null,
    bins,
    binsOnlyBefore: before.bins.filter((b) => !afterBins.has(b.index)).map((b) => b.index),
    binsOnlyAfter: after.bins.filter((b) => !beforeIdx.has(b.index)).map((b) => b.index),
    before: beforeCheck,
    after: afterCheck,
    repairVerified: afterCheck.meets,
    conditions: options.conditions ? compareConditions(options.conditions.before, options.conditions.after, system) : null,
  };
}

export interface BatteryComparison {
  readonly deliveredAh: Delta;
  readonly deliveredWh: Delta;
  /** State of health, % of rated capacity. */
  readonly stateOfHealthPct: Delta;
  readonly internalResistanceOhms: Delta | null;
  readonly before: CapacityVerdict;
  readonly after: CapacityVerdict;
  /** The after-test meets the threshold. */
  readonly repairVerified: boolean;
  readonly conditions: ConditionsComparison | null;
}

/** Battery before vs after (e.g. a pack repaired or replaced): capacity deltas and each against the brand's threshold. */
export function compareBatteryRuns(
  before: BatteryAnalysis,
  after: BatteryAnalysis,
  policy: { thresholdPct: number },
  options: { conditions?: { before: TestConditions; after: TestConditions } | null; units?: UnitSystem } = {},
): BatteryComparison {
  const { thresholdPct } = policy;
  if (!Number.isFinite(thresholdPct) || thresholdPct <= 0 || thresholdPct > 100) throw new RangeError(`thresholdPct must be in (0, 100], got ${thresholdPct}`);
  const b = capacityVerdict(before.stateOfHealthPct, thresholdPct);
  const a = capacityVerdict(after.stateOfHealthPct, thresholdPct);
  return {
    deliveredAh: delta(before.deliveredAh, after.deliveredAh),
    deliveredWh: delta(before.deliveredWh, after.deliveredWh),
    stateOfHealthPct: delta(before.stateOfHealthPct, after.stateOfHealthPct),
    internalResistanceOhms:
      before.internalResistance && after.internalResistance ? delta(before.internalResistance.ohms, after.internalResistance.ohms) : null,
    before: b,
    after: a,
    repairVerified: a.status === 'meets',
    conditions: options.conditions ? compareConditions(options.conditions.before, options.conditions.after, options.units ?? 'metric') : null,
  };
}
