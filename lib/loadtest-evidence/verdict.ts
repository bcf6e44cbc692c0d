import { capacityVerdict, checkAgainstSpec, type CapacityVerdict, type SpecCheck } from '@/lib/loadtest';
import type { UnitSystem } from '@/lib/units';
import type { BatterySummary, DynoSummary, LoadTestSpec, LoadTestSummary } from './records';

export type RunVerdict =
  | { readonly kind: 'dyno'; readonly meets: boolean; readonly check: SpecCheck; readonly message: string }
  | { readonly kind: 'battery'; readonly meets: boolean; readonly check: CapacityVerdict; readonly message: string }
  /** Nothing to check against: the part has no minimums, or the brand no capacity threshold. The rep decides. */
  | { readonly kind: 'no-spec'; readonly meets: false; readonly message: string };

/** True when the spec names at least one minimum a dyno run can be held to. */
export function dynoSpecIsSet(spec: Extract<LoadTestSpec, { kind: 'dyno' }>): boolean {
  return spec.minWheelPowerW !== null || spec.minWheelTorqueNm !== null;
}

/**
 * One run against the part's spec, in the reader's units. For an after-test, `meets` is what
 * decides whether the repair is verified without the rep; it is computed here, on the server's
 * stored analysis, never taken from the browser.
 */
export function runVerdict(summary: LoadTestSummary, spec: LoadTestSpec, units: UnitSystem): RunVerdict {
  if (summary.kind === 'dyno' && spec.kind === 'dyno') return dynoVerdict(summary, spec, units);
  if (summary.kind === 'battery' && spec.kind === 'battery') return batteryVerdict(summary, spec);
  throw new TypeError(`A ${summary.kind} run cannot be checked against a ${spec.kind} spec`);
}

function dynoVerdict(summary: DynoSummary, spec: Extract<LoadTestSpec, { kind: 'dyno' }>, units: UnitSystem): RunVerdict {
  if (!dynoSpecIsSet(spec)) {
    return { kind: 'no-spec', meets: false, message: 'The part has no minimum wheel power or torque in the catalog, so the run cannot verify the repair on its own; the rep decides.' };
  }
  const check = checkAgainstSpec(summary[units], { minWheelPowerW: spec.minWheelPowerW, minWheelTorqueNm: spec.minWheelTorqueNm }, units);
  const parts = [check.power, check.torque].filter((v) => v.status !== 'not-specified').map((v) => v.message);
  return { kind: 'dyno', meets: check.meets, check, message: parts.join(' ') };
}

function batteryVerdict(summary: BatterySummary, spec: Extract<LoadTestSpec, { kind: 'battery' }>): RunVerdict {
  if (spec.thresholdPct === null) {
    return { kind: 'no-spec', meets: false, message: 'The brand sets no capacity threshold for batteries, so the run cannot verify the repair on its own; the rep decides.' };
  }
  const check = capacityVerdict(summary.analysis.stateOfHealthPct, spec.thresholdPct);
  return { kind: 'battery', meets: check.status === 'meets', check, message: check.message };
}
