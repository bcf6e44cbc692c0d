import Papa from 'papaparse';
import type { CsvDialect } from './csv-dialect';
import { columnRef, MAX_REPORTED_ERRORS, type LoadtestIssue } from './issues';
import { parseDecimal } from './parse-number';

/** One column to read: its position, how to scale it to SI and whether it may be negative. */
export interface ColumnReadSpec {
  readonly index: number;
  readonly header: string;
  /** SI = raw × mul ÷ div. */
  readonly mul: number;
  readonly div: number;
  readonly allowNegative: boolean;
  /** What to call a negative value's problem, e.g. "a dyno run records the motor driving the roller". */
  readonly negativeHint?: string;
}

export interface ColumnsRead {
  /** One SI array per requested column, `count` long. */
  readonly values: Float64Array[];
  /** 1-based file line of each sample. */
  readonly lines: Int32Array;
  readonly count: number;
  /** Whether any value in each column is non-zero. */
  readonly nonZero: boolean[];
  readonly errors: LoadtestIssue[];
  /** All errors found, including those not listed. */
  readonly errorCount: number;
}

/** Characters handed to papaparse at a time: small enough that each chunk's row arrays die young. */
const CHUNK_CHARS = 256 * 1024;

/**
 * Feed papaparse whole lines, a chunk at a time, through its `Parser` class. Papaparse's own string
 * streaming keeps every chunk reachable to the end of the file (several times the file's size in
 * memory), and `Papa.parse` on each chunk spends most of its time in garbage collection of results
 * its wrapper keeps alive; the `Parser` underneath does the same parsing without either (measured
 * with tests/bench/loadtest-dyno.ts). A chunk only ends at a line break outside quotes: after an
 * even number of quote characters.
 */
function forEachChunk(body: string, dialect: CsvDialect, onChunk: (res: Papa.ParseResult<string[]>, text: string) => void): void {
  const nl = dialect.newline;
  const len = body.length;
  // Next quote character at or after the scan position; found one at a time so the whole scan stays linear.
  let nextQuote = body.indexOf('"');
  // Exported by papaparse and typed in @types/papaparse; parse() starts afresh on every call.
  const parser = new Papa.Parser({ delimiter: dialect.delimiter, newline: nl });
  let pos = 0;
  while (pos < len) {
    let end = len;
    let target = Math.min(len, pos + CHUNK_CHARS);
    let odd = false;
    while (target < len) {
      const brk = body.indexOf(nl, target);
      const next = brk === -1 ? len : brk + nl.length;
      while (nextQuote !== -1 && nextQuote < next) {
        odd = !odd;
        nextQuote = body.indexOf('"', nextQuote + 1);
      }
      if (!odd || next >= len) {
        end = next;
        break;
      }
      target = next;
    }
    // Leave out the chunk's final line break: papaparse would report an empty row after it.
    const chunkEnd = end - pos >= nl.length && body.startsWith(nl, end - nl.length) ? end - nl.length : end;
    const text = body.slice(pos, chunkEnd);
    onChunk(parser.parse(text, 0, false) as Papa.ParseResult<string[]>, text);
    pos = end;
  }
}

function countChar(text: string, ch: string): number {
  let n = 0;
  let i = text.indexOf(ch);
  while (i !== -1) {
    n++;
    i = text.indexOf(ch, i + 1);
  }
  return n;
}

/**
 * Read the body of a CSV (the lines after the header) into typed SI columns with papaparse.
 * Blank lines, lines of empty fields and `#` comment lines are skipped; each sample keeps its file
 * line. Fields must be plain decimal numbers in the file's decimal mark; an empty, non-numeric or
 * (where not allowed) negative value is an error naming its line and column.
 */
export function readColumns(text: string, dialect: CsvDialect, specs: readonly ColumnReadSpec[]): ColumnsRead {
  const body = text.slice(dialect.bodyStart);
  const newlineChar = dialect.newline === '\r' ? '\r' : '\n';
  const capacity = countChar(body, newlineChar) + 1;
  const k = specs.length;
  const values = specs.map(() => new Float64Array(capacity));
  const nonZero = specs.map(() => false);
  const lines = new Int32Array(capacity);
  const idx = Int32Array.from(specs, (s) => s.index);
  const mul = Float64Array.from(specs, (s) => s.mul);
  const div = Float64Array.from(specs, (s) => s.div);
  const allowNeg = specs.map((s) => s.allowNegative);
  const needed = specs.reduce((m, s) => Math.max(m, s.index + 1), 0);
  const headerCount = dialect.headers.length;
  const mark = dialect.decimalMark;
  const comma = mark === ',';
  const mayHaveQuotedNewlines = body.indexOf('"') !== -1;

  const errors: LoadtestIssue[] = [];
  let errorCount = 0;
  // Keep plenty, sort by line and column, then cut: papaparse reports quoting problems per chunk.
  const report = (issue: LoadtestIssue) => {
    errorCount++;
    if (errors.length < 50 * MAX_REPORTED_ERRORS) errors.push(issue);
  };

  let n = 0;
  let line = dialect.headerLine;

  const fieldError = (row: number, c: number, raw: string): void => {
    const spec = specs[c] as ColumnReadSpec;
    const where = `Line ${row}, ${columnRef(spec.header, spec.index + 1)}`;
    const trimmed = raw.trim();
    if (trimmed === '') {
      report({ code: 'missing-value', row, column: spec.header, columnNumber: spec.index + 1, message: `${where}: the value is empty.` });
    } else if (comma && trimmed.includes('.')) {
      report({
        code: 'not-a-number',
        row,
        column: spec.header,
        columnNumber: spec.index + 1,
        message: `${where}: "${trimmed}" has a decimal point, but this file uses decimal commas. Remove thousands separators and use one decimal mark.`,
      });
    } else {
      report({ code: 'not-a-number', row, column: spec.header, columnNumber: spec.index + 1, message: `${where}: "${trimmed}" is not a number.` });
    }
  };

  forEachChunk(body, dialect, (res, chunkText) => {
    const rows = res.data;
    const chunkFirstLine = line + 1;
    for (let r = 0; r < rows.length; r++) {
      const row = rows[r] as string[];
      line++;
      const startLine = line;
      if (mayHaveQuotedNewlines) {
        for (let f = 0; f < row.length; f++) {
          const field = row[f] as string;
          if (field.indexOf(newlineChar) !== -1) line += countChar(field, newlineChar);
        }
      }
      const first = row[0] as string;
      if (first.length === 0) {
        let empty = true;
        for (let f = 1; f < row.length; f++) if ((row[f] as string).trim() !== '') empty = false;
        if (empty) continue;
      } else {
        const c0 = first.charCodeAt(0);
        if (c0 === 35 /* # */) continue;
        if (c0 === 32 || c0 === 9) {
          const t = first.trimStart();
          if (t === '' && row.length === 1) continue;
          if (t.charCodeAt(0) === 35) continue;
        }
      }
      if (row.length < needed || (row.length > headerCount && !extraFieldsEmpty(row, headerCount))) {
        report({
          code: 'wrong-field-count',
          row: startLine,
          message: `Line ${startLine} has ${row.length} values but the header names ${headerCount} columns.`,
        });
        continue;
      }
      let ok = true;
      for (let c = 0; c < k; c++) {
        const raw = row[idx[c] as number] as string;
        const v = parseDecimal(raw, mark);
        if (v !== v || v === Infinity || v === -Infinity) {
          fieldError(startLine, c, raw);
          ok = false;
          continue;
        }
        if (v < 0 && !allowNeg[c]) {
          const spec = specs[c] as ColumnReadSpec;
          report({
            code: 'negative-value',
            row: startLine,
            column: spec.header,
            columnNumber: spec.index + 1,
            message: `Line ${startLine}, ${columnRef(spec.header, spec.index + 1)}: ${raw.trim()} is negative.${spec.negativeHint ? ` ${spec.negativeHint}` : ''}`,
          });
          ok = false;
          continue;
        }
        if (v !== 0) nonZero[c] = true;
        const d = div[c] as number;
        (values[c] as Float64Array)[n] = d === 1 ? v * (mul[c] as number) : v / d;
      }
      if (ok) {
        lines[n] = startLine;
        n++;
      }
    }
    for (const e of res.errors) {
      if (e.code === 'TooFewFields' || e.code === 'TooManyFields') continue;
      // Papaparse gives the character offset in the chunk; count line breaks up to it.
      const at = typeof e.index === 'number' ? chunkFirstLine + countChar(chunkText.slice(0, e.index), newlineChar) : line;
      report({
        code: 'bad-quotes',
        row: at,
        message: `Line ${at}: a double quote is not closed (${e.message.toLowerCase()}). Quote whole values, and write a quote inside a value as "".`,
      });
    }
  });

  errors.sort((a, b) => (a.row ?? Infinity) - (b.row ?? Infinity) || (a.columnNumber ?? 0) - (b.columnNumber ?? 0));
  errors.length = Math.min(errors.length, MAX_REPORTED_ERRORS);
  return { values: values.map((v) => v.subarray(0, n)), lines: lines.subarray(0, n), count: n, nonZero, errors, errorCount };
}

function extraFieldsEmpty(row: readonly string[], from: number): boolean {
  for (let f = from; f < row.length; f++) if ((row[f] as string).trim() !== '') return false;
  return true;
}
