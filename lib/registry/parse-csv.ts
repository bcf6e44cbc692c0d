import Papa from 'papaparse';
import { REGISTRY_COLUMNS, REGISTRY_LIMITS, type RegistryColumn } from './layout';

/** One data row as read; `row` is the spreadsheet row number (the header is row 1). */
export type RawRegistryRow = { row: number; fields: Partial<Record<RegistryColumn, string>>; readProblem?: string };

export type ParsedRegistryFile = { ok: true; rows: RawRegistryRow[] } | { ok: false; message: string };

const KNOWN = REGISTRY_COLUMNS.map((c) => c.name) as readonly string[];
const normaliseHeader = (h: string) => h.replace(/^\uFEFF/, '').trim().toLowerCase().replace(/[\s-]+/g, '_');

/**
 * Reads a registry file in our layout. Problems with the file as a whole (empty, wrong
 * separator, missing or unknown columns, too many rows) refuse the file; problems with one row
 * (a field too many or too few, a broken quote) stay on that row for the preview.
 */
export function parseRegistryCsv(text: string): ParsedRegistryFile {
  const body = text.replace(/^\uFEFF/, '');
  if (body.trim() === '') return { ok: false, message: 'The file is empty.' };
  const firstLine = body.split(/\r?\n/, 1)[0] ?? '';
  if (!firstLine.includes(',') && (firstLine.includes(';') || firstLine.includes('\t'))) {
    return { ok: false, message: `The header row is separated by ${firstLine.includes(';') ? 'semicolons' : 'tabs'}; this layout uses commas. Save the file as comma-separated CSV.` };
  }

  const parsed = Papa.parse<string[]>(body, { delimiter: ',', skipEmptyLines: false });
  const [header, ...records] = parsed.data;
  if (!header) return { ok: false, message: 'The file has no header row.' };
  const names = header.map(normaliseHeader);
  const unknown = names.filter((n) => n !== '' && !KNOWN.includes(n));
  if (unknown.length) {
    return { ok: false, message: `Unknown column${unknown.length > 1 ? 's' : ''} ${unknown.map((u) => `“${u}”`).join(', ')}. The layout has ${KNOWN.join(', ')}.` };
  }
  const seen = new Set<string>();
  for (const n of names) {
    if (n === '') return { ok: false, message: 'The header row has an empty column name.' };
    if (seen.has(n)) return { ok: false, message: `The column “${n}” appears twice in the header row.` };
    seen.add(n);
  }
  const missing = REGISTRY_COLUMNS.filter((c) => c.required && !seen.has(c.name)).map((c) => c.name);
  if (missing.length) return { ok: false, message: `The header row lacks ${missing.join(', ')}. The first row must name the columns.` };

  const rowErrors = new Map<number, string>();
  for (const e of parsed.errors) {
    if (typeof e.row !== 'number') continue;
    const message =
      e.code === 'TooManyFields' ? 'has more fields than the header; quote a value that contains a comma'
      : e.code === 'TooFewFields' ? 'has fewer fields than the header'
      : e.code === 'MissingQuotes' || e.code === 'InvalidQuotes' ? 'has a quote that is not closed'
      : e.message;
    if (!rowErrors.has(e.row)) rowErrors.set(e.row, message);
  }

  const rows: RawRegistryRow[] = [];
  records.forEach((record, i) => {
    if (record.every((f) => f.trim() === '')) return;
    const fields: RawRegistryRow['fields'] = {};
    names.forEach((n, col) => {
      fields[n as RegistryColumn] = (record[col] ?? '').trim();
    });
    // papaparse counts records from 0 with the header as record 0.
    const problem = rowErrors.get(i + 1) ?? (record.length !== names.length ? (record.length > names.length ? 'has more fields than the header; quote a value that contains a comma' : 'has fewer fields than the header') : undefined);
    rows.push({ row: i + 2, fields, ...(problem ? { readProblem: problem } : {}) });
  });
  if (rows.length === 0) return { ok: false, message: 'The file has a header row but no bikes below it.' };
  if (rows.length > REGISTRY_LIMITS.maxRows) {
    return { ok: false, message: `The file has ${rows.length} rows; one import takes at most ${REGISTRY_LIMITS.maxRows}. Split it into smaller files.` };
  }
  return { ok: true, rows };
}
