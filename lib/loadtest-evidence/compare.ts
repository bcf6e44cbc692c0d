import { compareBatteryRuns, compareConditions, compareRuns, type BatteryComparison, type ConditionsComparison, type RunComparison } from '@/lib/loadtest';
import type { UnitSystem } from '@/lib/units';
import type { LoadTestConditionsSi, LoadTestSpec, LoadTestSummary } from './records';
import { dynoSpecIsSet } from './verdict';

export interface ComparableRun {
  readonly summary: LoadTestSummary;
  readonly conditions: LoadTestConditionsSi;
  readonly spec: LoadTestSpec;
}

export type BeforeAfter =
  | { readonly kind: 'dyno'; readonly runs: RunComparison | null; readonly conditions: ConditionsComparison }
  | { readonly kind: 'battery'; readonly runs: BatteryComparison | null; readonly conditions: ConditionsComparison };

/**
 * Before vs after in the reader's units: deltas at the peaks and per bin against the after-run's
 * spec (the spec of the part now fitted), and whether the test conditions let the two be compared.
 * Without a spec the deltas are left out and only the conditions are compared.
 */
export function beforeAfter(before: ComparableRun, after: ComparableRun, units: UnitSystem): BeforeAfter {
  const conditions = compareConditions(before.conditions, after.conditions, units);
  const pair = { before: before.conditions, after: after.conditions };
  if (before.summary.kind === 'dyno' && after.summary.kind === 'dyno' && after.spec.kind === 'dyno') {
    const spec = after.spec;
    const runs = dynoSpecIsSet(spec)
      ? compareRuns(before.summary[units], after.summary[units], { minWheelPowerW: spec.minWheelPowerW, minWheelTorqueNm: spec.minWheelTorqueNm }, { conditions: pair, units })
      : null;
    return { kind: 'dyno', runs, conditions };
  }
  if (before.summary.kind === 'battery' && after.summary.kind === 'battery' && after.spec.kind === 'battery') {
    const threshold = after.spec.thresholdPct;
    const runs = threshold !== null ? compareBatteryRuns(before.summary.analysis, after.summary.analysis, { thresholdPct: threshold }, { conditions: pair, units }) : null;
    return { kind: 'battery', runs, conditions };
  }
  throw new TypeError(`A ${before.summary.kind} run cannot be compared with a ${after.summary.kind} run`);
}
