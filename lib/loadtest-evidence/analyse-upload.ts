import {
  analyseBattery,
  analyseDyno,
  parseBatteryCsv,
  parseDynoCsv,
  MIN_SAMPLES,
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
    const metric = analyseDyno(run, { ...options, units: 'metric' });
    const sweep = sweepOf(run, metric.topSpeed.timeS);
    const withCurve = (units: UnitSystem, full: DynoAnalysis): DynoAnalysis =>
      sweep === run ? full : { ...full, bins: analyseDyno(sweep, { ...options, units }).bins };
    const summary: LoadTestSummary = {
      kind: 'dyno',
      metric: withCurve('metric', metric),
      imperial: withCurve('imperial', analyseDyno(run, { ...options, units: 'imperial' })),
      curve: { throughTimeS: metric.topSpeed.timeS, samplesLeftOut: run.count - sweep.count },
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
 * The run up to and including its top speed. A roller run-down after the sweep carries speed with
 * no drive; left in, it would average zeros into every speed step the sweep passed through.
 */
function sweepOf(run: DynoRun, topSpeedTimeS: number): DynoRun {
  let end = run.count;
  while (end > MIN_SAMPLES && (run.timeS[end - 1] as number) > topSpeedTimeS) end--;
  if (end === run.count) return run;
  const cut = (a: Float64Array | null) => (a ? a.subarray(0, end) : null);
  return {
    ...run,
    count: end,
    timeS: run.timeS.subarray(0, end),
    speedMs: run.speedMs.subarray(0, end),
    wheelTorqueNm: cut(run.wheelTorqueNm),
    wheelPowerW: cut(run.wheelPowerW),
    lines: run.lines.subarray(0, end),
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
