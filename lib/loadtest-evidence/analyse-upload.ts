import {
  analyseBattery,
  analyseDyno,
  parseBatteryCsv,
  parseDynoCsv,
  MIN_SAMPLES,
  movingAverage,
  SMOOTHING_WINDOW_S,
  type ColumnMapping,
  type ColumnRole,
  type DynoAnalysis,
  type DynoRun,
  type LoadtestInput,
  type LoadtestIssue,
  type NeedsMapping,
  type TestConditions,
} from '@/lib/loadtest';
import { wheelCircumference, type UnitSystem } from '@/lib/units';
import type { LoadTestKind, LoadTestSpec, LoadTestSummary } from './records';
import { runVerdict, type RunVerdict } from './verdict';

export type UploadAnalysis =
  | {
      readonly status: 'ok';
      readonly summary: LoadTestSummary;
      readonly verdict: RunVerdict;
      readonly warnings: readonly LoadtestIssue[];
      readonly signature: string;
      readonly headers: readonly string[];
      /** What each column was read as: header → quantity and unit. */
      readonly columnMapping: ColumnMapping;
      readonly sampleCount: number;
    }
  | (NeedsMapping & { readonly kind: LoadTestKind })
  | { readonly status: 'error'; readonly errors: readonly LoadtestIssue[]; readonly warnings: readonly LoadtestIssue[] }
  /** The run cannot be analysed with these conditions (a dyno run needs the wheel's circumference). */
  | { readonly status: 'conditions'; readonly field: 'tyreSize' | 'measuredCircumference'; readonly message: string };

/**
 * A load-test file, its conditions and the part's spec → the stored summary and the verdict. Pure:
 * the caller fetched the bytes. The dyno curve is binned in both unit systems so any reader sees
 * 1 km/h or 1 mph steps.
 */
export function analyseUpload(
  input: LoadtestInput,
  opts: { kind: LoadTestKind; spec: LoadTestSpec; conditions: TestConditions; mapping?: ColumnMapping | null },
): UploadAnalysis {
  const { kind, spec, conditions } = opts;
  if (kind === 'dyno') {
    const wheel = wheelCircumference({ tyre: conditions.tyreSize, measuredMm: conditions.measuredCircumferenceMm ?? null });
    if (!wheel.ok) return { status: 'conditions', field: wheel.field === 'tyre' ? 'tyreSize' : 'measuredCircumference', message: wheel.message };
    const imported = parseDynoCsv(input, { mapping: opts.mapping ?? null });
    if (imported.status === 'needs-mapping') return { ...imported, kind };
    if (imported.status === 'error') return imported;
    const run = imported.run;
    const legalClass = spec.kind === 'dyno' ? spec.legalClass : null;
    const options = { circumferenceM: wheel.metres, legalClass };
    const driven = drivenSamples(run);
    // Peaks, band and checks over the whole file (the library's); the curve from the driven samples.
    const withCurve = (units: UnitSystem): DynoAnalysis => {
      const full = analyseDyno(run, { ...options, units });
      return driven === run ? full : { ...full, bins: analyseDyno(driven, { ...options, units }).bins };
    };
    const summary: LoadTestSummary = {
      kind: 'dyno',
      metric: withCurve('metric'),
      imperial: withCurve('imperial'),
      curve: { samplesLeftOut: run.count - driven.count },
      fileUnits: run.fileUnits,
      circumference: { metres: wheel.metres, source: wheel.source, tyreIso: wheel.tyre?.iso ?? null, notes: wheel.notes },
      source: run.source,
    };
    return ok(summary, spec, run.warnings, run.source, run.count);
  }
  const imported = parseBatteryCsv(input, { mapping: opts.mapping ?? null });
  if (imported.status === 'needs-mapping') return { ...imported, kind };
  if (imported.status === 'error') return imported;
  if (spec.kind !== 'battery') throw new TypeError('A battery discharge needs a battery spec');
  const run = imported.run;
  const summary: LoadTestSummary = {
    kind: 'battery',
    analysis: analyseBattery(run, { ratedCapacityAh: spec.ratedCapacityAh, thresholdPct: spec.thresholdPct, nominalVoltageV: spec.nominalVoltageV }),
    signFlipped: run.signFlipped,
    source: run.source,
  };
  return ok(summary, spec, run.warnings, run.source, run.count);
}

/**
 * A roller slowing down faster than this (m/s²) is running down, not being driven: 0.5 km/h per
 * second. A load sweep accelerates or holds a speed; a run-down after it carries speed with little
 * or no drive and, left in, would average near-zero power into every speed step it passes through
 * (common practice, no source: dyno operators read the curve from the sweep, not the run-down).
 */
export const RUN_DOWN_DECELERATION_MS2 = 0.5 / 3.6;

/** The samples that make the curve: all but those where the (smoothed) roller speed is falling faster than a run-down. */
function drivenSamples(run: DynoRun): DynoRun {
  const n = run.count;
  const v = movingAverage(run.timeS, run.speedMs, SMOOTHING_WINDOW_S);
  const keep: number[] = [];
  let back = 0;
  for (let i = 0; i < n; i++) {
    const t = run.timeS[i] as number;
    // Compare with the sample one smoothing window earlier, so sensor ripple does not count as slowing.
    while (back < i && (run.timeS[back + 1] as number) <= t - SMOOTHING_WINDOW_S) back++;
    const dt = t - (run.timeS[back] as number);
    const slowing = dt > 0 && ((v[i] as number) - (v[back] as number)) / dt < -RUN_DOWN_DECELERATION_MS2;
    if (!slowing) keep.push(i);
  }
  if (keep.length === n || keep.length < MIN_SAMPLES) return run;
  const pick = (a: Float64Array) => Float64Array.from(keep, (i) => a[i] as number);
  return {
    ...run,
    count: keep.length,
    timeS: pick(run.timeS),
    speedMs: pick(run.speedMs),
    wheelTorqueNm: run.wheelTorqueNm ? pick(run.wheelTorqueNm) : null,
    wheelPowerW: run.wheelPowerW ? pick(run.wheelPowerW) : null,
    lines: Int32Array.from(keep, (i) => run.lines[i] as number),
  };
}

function ok(
  summary: LoadTestSummary,
  spec: LoadTestSpec,
  warnings: readonly LoadtestIssue[],
  source: LoadTestSummary['source'],
  sampleCount: number,
): UploadAnalysis {
  const columnMapping: Record<string, ColumnRole> = {};
  for (const c of source.columns) columnMapping[c.header] = { quantity: c.quantity, unit: c.unit } as ColumnRole;
  return {
    status: 'ok',
    summary,
    // Verdicts are worded per reader; `meets` does not depend on the units.
    verdict: runVerdict(summary, spec, 'metric'),
    warnings,
    signature: source.signature,
    headers: source.headers,
    columnMapping,
    sampleCount,
  };
}
