import type { UnitSystem } from '@/lib/units';
import type { ColumnMapping } from './columns';
import { importTable, type ImportSource, type TableSpec } from './import-table';
import type { LoadtestIssue } from './issues';
import type { NeedsMapping } from './resolve-columns';
import type { LoadtestInput } from './text-input';

/** A dyno run as imported: SI samples in time order, each with its file line. */
export interface DynoRun {
  readonly kind: 'dyno';
  readonly count: number;
  /** s */
  readonly timeS: Float64Array;
  /** m/s */
  readonly speedMs: Float64Array;
  /** N·m at the wheel, or null when the file has no torque column. */
  readonly wheelTorqueNm: Float64Array | null;
  /** W at the wheel, or null when the file has no power column. */
  readonly wheelPowerW: Float64Array | null;
  /** 1-based file line of each sample. */
  readonly lines: Int32Array;
  /** The unit system the file's speed column was in; a good default for showing the run. */
  readonly fileUnits: UnitSystem;
  readonly source: ImportSource;
  readonly warnings: readonly LoadtestIssue[];
}

export type DynoImportResult =
  | { readonly status: 'ok'; readonly run: DynoRun }
  | NeedsMapping
  | { readonly status: 'error'; readonly errors: readonly LoadtestIssue[]; readonly warnings: readonly LoadtestIssue[] };

const NO_NEGATIVE =
  'A dyno run records the motor driving the roller; trim coast-down or braking from the export, or check the sensor sign.';

export const DYNO_SPEC: TableSpec = {
  kind: 'dyno',
  required: ['time', 'speed'],
  atLeastOne: ['wheelTorque', 'wheelPower'],
  mayBeNegative: [],
  notAllZero: ['speed', 'wheelTorque', 'wheelPower'],
  negativeHint: { time: 'Time must count up from the start of the run.', speed: NO_NEGATIVE, wheelTorque: NO_NEGATIVE, wheelPower: NO_NEGATIVE },
  allZeroHint: {
    speed: 'The roller speed was not recorded; check the speed sensor and run again.',
    wheelTorque: 'The torque sensor was not recording; check it and run again.',
    wheelPower: 'Power was not recorded; check the dyno settings and run again.',
  },
};

/**
 * Read a roller-dynamometer CSV. Our own column names are read at once; other headers return
 * `needs-mapping` until the dealer's `mapping` is supplied.
 */
export function parseDynoCsv(input: LoadtestInput, options: { mapping?: ColumnMapping | null } = {}): DynoImportResult {
  const t = importTable(input, DYNO_SPEC, options.mapping);
  if (t.status !== 'ok') return t;
  const speedUnit = t.source.columns.find((c) => c.quantity === 'speed')?.unit;
  return {
    status: 'ok',
    run: {
      kind: 'dyno',
      count: t.count,
      timeS: t.time,
      speedMs: t.data.speed as Float64Array,
      wheelTorqueNm: t.data.wheelTorque ?? null,
      wheelPowerW: t.data.wheelPower ?? null,
      lines: t.lines,
      fileUnits: speedUnit === 'mph' ? 'imperial' : 'metric',
      source: t.source,
      warnings: t.warnings,
    },
  };
}
