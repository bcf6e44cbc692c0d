import { siScale, type Quantity, type UnitOf } from '@/lib/units';
import { headerSignature, type ColumnMapping, type ColumnQuantity, type ColumnRole } from './columns';
import { detectDialect, type DecimalMark, type Delimiter } from './csv-dialect';
import { columnRef, type LoadtestIssue } from './issues';
import { MIN_SAMPLES } from './limits';
import { readColumns } from './read-columns';
import { QUANTITY_NAMES, resolveColumns, type ImportSpec, type NeedsMapping } from './resolve-columns';
import { readLoadtestText, type LoadtestInput } from './text-input';
import { orderByTime } from './time-order';

/** Which unit quantity each column quantity converts with. */
const UNIT_QUANTITY: Record<ColumnQuantity, Quantity> = {
  time: 'time',
  speed: 'speed',
  wheelPower: 'power',
  wheelTorque: 'torque',
  voltage: 'voltage',
  current: 'current',
};

/** How a file was read, kept with the run so the rep can see it. */
export interface ImportSource {
  readonly delimiter: Delimiter;
  readonly decimalMark: DecimalMark;
  readonly headers: readonly string[];
  readonly signature: string;
  readonly columns: ReadonlyArray<{ readonly quantity: ColumnQuantity; readonly header: string; readonly columnNumber: number; readonly unit: string }>;
}

export interface TableSpec extends ImportSpec {
  /** Quantities whose values may be negative. */
  readonly mayBeNegative: readonly ColumnQuantity[];
  /** Quantities that must not be zero on every line. */
  readonly notAllZero: readonly ColumnQuantity[];
  readonly negativeHint: Partial<Record<ColumnQuantity, string>>;
  readonly allZeroHint: Partial<Record<ColumnQuantity, string>>;
}

export type TableResult =
  | {
      readonly status: 'ok';
      readonly count: number;
      /** SI values per quantity found, in time order. */
      readonly data: Partial<Record<ColumnQuantity, Float64Array>>;
      readonly time: Float64Array;
      readonly lines: Int32Array;
      readonly source: ImportSource;
      readonly warnings: LoadtestIssue[];
    }
  | NeedsMapping
  | { readonly status: 'error'; readonly errors: readonly LoadtestIssue[]; readonly warnings: readonly LoadtestIssue[] };

/** The steps every load-test import shares: text → dialect → columns → typed SI samples in time order. */
export function importTable(input: LoadtestInput, spec: TableSpec, mapping?: ColumnMapping | null): TableResult {
  const text = readLoadtestText(input);
  if (!text.ok) return { status: 'error', errors: [text.error], warnings: [] };
  const warnings: LoadtestIssue[] = [...text.warnings];

  const dialect = detectDialect(text.text);
  if (!dialect.ok) return { status: 'error', errors: [dialect.error], warnings };
  const d = dialect.dialect;

  const resolved = resolveColumns(d.headers, spec, mapping);
  if (resolved.status === 'needs-mapping') return resolved;
  if (resolved.status === 'error') return { status: 'error', errors: resolved.errors, warnings };
  warnings.push(...resolved.warnings);

  const specs = resolved.columns.map((c) => {
    const role = c.role as Exclude<ColumnRole, { quantity: 'ignore' }>;
    const uq = UNIT_QUANTITY[role.quantity];
    const scale = siScale(uq, role.unit as UnitOf<typeof uq>);
    return {
      index: c.index,
      header: c.header,
      mul: scale.mul,
      div: scale.div,
      allowNegative: spec.mayBeNegative.includes(role.quantity),
      negativeHint: spec.negativeHint[role.quantity],
    };
  });
  const read = readColumns(text.text, d, specs);
  if (read.errorCount > 0) {
    const errors = [...read.errors];
    if (read.errorCount > errors.length) {
      errors.push({ code: 'more-errors', message: `…and ${read.errorCount - errors.length} more problems of the same kinds.` });
    }
    return { status: 'error', errors, warnings };
  }

  const errors: LoadtestIssue[] = [];
  resolved.columns.forEach((c, k) => {
    if (spec.notAllZero.includes(c.role.quantity) && read.count > 0 && !read.nonZero[k]) {
      errors.push({
        code: 'all-zero',
        column: c.header,
        columnNumber: c.index + 1,
        message: `${columnRef(c.header, c.index + 1)} (${QUANTITY_NAMES[c.role.quantity]}) is zero on every line. ${spec.allZeroHint[c.role.quantity] ?? ''}`.trim(),
      });
    }
  });
  if (errors.length) return { status: 'error', errors, warnings };

  const timeK = resolved.columns.findIndex((c) => c.role.quantity === 'time');
  const columns = read.values;
  const ordered = orderByTime(columns[timeK] as Float64Array, columns, read.lines);
  warnings.push(...ordered.warnings);

  const count = ordered.time.length;
  if (count < MIN_SAMPLES) {
    const message =
      count === 0
        ? 'The file has a header but no samples.'
        : `The file has only one sample (line ${ordered.lines[0]}); a run needs at least ${MIN_SAMPLES}.`;
    return { status: 'error', errors: [{ code: 'too-few-samples', message, ...(count === 1 ? { row: ordered.lines[0] } : {}) }], warnings };
  }

  const data: Partial<Record<ColumnQuantity, Float64Array>> = {};
  resolved.columns.forEach((c, k) => {
    data[c.role.quantity] = ordered.columns[k] as Float64Array;
  });
  return {
    status: 'ok',
    count,
    data,
    time: ordered.time,
    lines: ordered.lines,
    source: {
      delimiter: d.delimiter,
      decimalMark: d.decimalMark,
      headers: d.headers,
      signature: headerSignature(d.headers),
      columns: resolved.columns.map((c) => ({
        quantity: c.role.quantity,
        header: c.header,
        columnNumber: c.index + 1,
        unit: (c.role as { unit: string }).unit,
      })),
    },
    warnings,
  };
}
