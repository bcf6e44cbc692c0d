import type { ColumnMapping } from './columns';
import { importTable, type ImportSource, type TableSpec } from './import-table';
import { listRows, MAX_LISTED_ROWS, type LoadtestIssue } from './issues';
import type { NeedsMapping } from './resolve-columns';
import type { LoadtestInput } from './text-input';

/** A capacity discharge as imported: SI samples in time order; current positive for discharge. */
export interface BatteryRun {
  readonly kind: 'battery';
  readonly count: number;
  /** s */
  readonly timeS: Float64Array;
  /** V */
  readonly voltageV: Float64Array;
  /** A, positive = discharge. */
  readonly currentA: Float64Array;
  readonly lines: Int32Array;
  /** True when the file logged discharge as negative current and the sign was turned round. */
  readonly signFlipped: boolean;
  readonly source: ImportSource;
  readonly warnings: readonly LoadtestIssue[];
}

export type BatteryImportResult =
  | { readonly status: 'ok'; readonly run: BatteryRun }
  | NeedsMapping
  | { readonly status: 'error'; readonly errors: readonly LoadtestIssue[]; readonly warnings: readonly LoadtestIssue[] };

export const BATTERY_SPEC: TableSpec = {
  kind: 'battery',
  required: ['time', 'voltage', 'current'],
  atLeastOne: [],
  mayBeNegative: ['current'],
  notAllZero: ['voltage', 'current'],
  negativeHint: {
    time: 'Time must count up from the start of the test.',
    voltage: 'A battery voltage cannot be negative; check the probe polarity and the column.',
  },
  allZeroHint: {
    voltage: 'The voltage was not recorded; check the tester.',
    current: 'No current flowed; the load was not connected or not recording.',
  },
};

/**
 * Read a battery capacity discharge CSV. Testers differ in sign: when the current is mostly
 * negative, discharge was logged as negative; the sign is turned round and the dealer told so.
 */
export function parseBatteryCsv(input: LoadtestInput, options: { mapping?: ColumnMapping | null } = {}): BatteryImportResult {
  const t = importTable(input, BATTERY_SPEC, options.mapping);
  if (t.status !== 'ok') return t;
  const current = t.data.current as Float64Array;
  const warnings = [...t.warnings];

  // The sign of the net charge decides, so a few regenerative or noise samples cannot.
  let net = 0;
  for (let i = 1; i < t.count; i++) net += ((current[i] as number) + (current[i - 1] as number)) * ((t.time[i] as number) - (t.time[i - 1] as number));
  const signFlipped = net < 0;
  if (signFlipped) {
    for (let i = 0; i < current.length; i++) current[i] = -(current[i] as number);
    warnings.push({
      code: 'current-sign-flipped',
      message: 'This tester logs discharge current as negative; the sign was turned round so discharge counts as positive.',
    });
  }
  const charging: number[] = [];
  for (let i = 0; i < current.length; i++) if ((current[i] as number) < 0) charging.push(t.lines[i] as number);
  if (charging.length) {
    warnings.push({
      code: 'charge-current',
      rows: charging.slice(0, MAX_LISTED_ROWS),
      rowCount: charging.length,
      row: charging[0],
      message: `${charging.length} sample${charging.length === 1 ? ' shows' : 's show'} charging current (line${charging.length === 1 ? '' : 's'} ${listRows(charging)}); it counts against the delivered charge.`,
    });
  }
  return {
    status: 'ok',
    run: {
      kind: 'battery',
      count: t.count,
      timeS: t.time,
      voltageV: t.data.voltage as Float64Array,
      currentA: current,
      lines: t.lines,
      signFlipped,
      source: t.source,
      warnings,
    },
  };
}
