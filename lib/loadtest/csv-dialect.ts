import Papa from 'papaparse';
import type { LoadtestIssue } from './issues';

export type Delimiter = ',' | ';' | '\t' | '|';
export type DecimalMark = '.' | ',';
export type Newline = '\n' | '\r\n' | '\r';

/** How a CSV file is written, found from its first lines. */
export interface CsvDialect {
  readonly newline: Newline;
  readonly delimiter: Delimiter;
  readonly decimalMark: DecimalMark;
  /** Header fields as written (trimmed of surrounding quotes by the CSV reader). */
  readonly headers: readonly string[];
  /** 1-based line of the header. */
  readonly headerLine: number;
  /** Offset in the text where the line after the header starts. */
  readonly bodyStart: number;
}

export type DialectResult = { readonly ok: true; readonly dialect: CsvDialect } | { readonly ok: false; readonly error: LoadtestIssue };

/** Lines looked at after the header to settle the delimiter and decimal mark. */
const SAMPLE_LINES = 50;
const DELIMITERS: readonly Delimiter[] = ['\t', ';', ',', '|'];

const BLANK_RE = /^[\s,;\t|]*$/;
export const isCommentLine = (line: string): boolean => /^\s*#/.test(line);
export const isBlankLine = (line: string): boolean => BLANK_RE.test(line);

function detectNewline(text: string): Newline {
  const lf = text.indexOf('\n');
  if (lf > 0 && text.charCodeAt(lf - 1) === 13) return '\r\n';
  if (lf >= 0) return '\n';
  return text.indexOf('\r') >= 0 ? '\r' : '\n';
}

/** Count `ch` outside double quotes. */
function countOutsideQuotes(line: string, ch: string): number {
  let n = 0;
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '"') quoted = !quoted;
    else if (c === ch && !quoted) n++;
  }
  return n;
}

const COMMA_DECIMAL_RE = /^\s*"?[-+]?\d+,\d+(?:[eE][-+]?\d+)?"?\s*$/;
const DOT_DECIMAL_RE = /^\s*"?[-+]?\d*\.\d+(?:[eE][-+]?\d+)?"?\s*$/;

/**
 * Find the header (first line that is neither blank nor a `#` comment), the line ending, the
 * delimiter (tab, semicolon, comma or bar: the one the header uses and the sampled lines agree
 * with) and the decimal mark (comma only in files not delimited by commas, when the sampled values
 * use it and none uses a point).
 */
export function detectDialect(text: string): DialectResult {
  const newline = detectNewline(text);
  let pos = 0;
  let lineNo = 0;
  let header: { text: string; line: number; end: number } | null = null;
  const samples: Array<{ text: string; line: number }> = [];
  while (pos <= text.length && samples.length < SAMPLE_LINES) {
    const nl = text.indexOf(newline, pos);
    const end = nl === -1 ? text.length : nl;
    const line = text.slice(pos, end);
    lineNo++;
    const next = nl === -1 ? text.length + 1 : nl + newline.length;
    if (!isBlankLine(line) && !isCommentLine(line)) {
      if (header === null) header = { text: line, line: lineNo, end: Math.min(next, text.length) };
      else samples.push({ text: line, line: lineNo });
    }
    pos = next;
    if (nl === -1) break;
  }
  if (header === null) {
    return { ok: false, error: { code: 'no-header', message: 'The file has no header row: it holds only blank lines and # comments.' } };
  }

  let delimiter: Delimiter = ',';
  let best = -1;
  for (const d of DELIMITERS) {
    const inHeader = countOutsideQuotes(header.text, d);
    if (inHeader === 0) continue;
    const agreeing = samples.filter((s) => countOutsideQuotes(s.text, d) === inHeader).length;
    // Ties keep the earlier candidate: a semicolon header with decimal commas in the data must not read as comma-separated.
    if (agreeing > best) {
      best = agreeing;
      delimiter = d;
    }
  }

  let decimalMark: DecimalMark = '.';
  if (delimiter !== ',') {
    let commaAt: number | null = null;
    let dotAt: number | null = null;
    for (const s of samples) {
      for (const field of s.text.split(delimiter)) {
        if (commaAt === null && COMMA_DECIMAL_RE.test(field)) commaAt = s.line;
        if (dotAt === null && DOT_DECIMAL_RE.test(field)) dotAt = s.line;
      }
    }
    if (commaAt !== null && dotAt !== null) {
      return {
        ok: false,
        error: {
          code: 'mixed-decimal-marks',
          row: Math.max(commaAt, dotAt),
          message: `The file mixes decimal commas (line ${commaAt}) and decimal points (line ${dotAt}). Export it again with one decimal mark.`,
        },
      };
    }
    if (commaAt !== null) decimalMark = ',';
  }

  const parsed = Papa.parse<string[]>(header.text, { delimiter, newline });
  const headers = (parsed.data[0] ?? []).map((h) => h.trim());
  return { ok: true, dialect: { newline, delimiter, decimalMark, headers, headerLine: header.line, bodyStart: header.end } };
}
