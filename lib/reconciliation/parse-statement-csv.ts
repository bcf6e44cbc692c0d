import Papa from 'papaparse';
import { isIsoDate } from '@/lib/calendar';
import { addMinor, isCurrencyCode, negateMinor, parseAmount, type CurrencyCode, type DecimalSeparator, type MinorUnits } from '@/lib/money';
import type { StatementLine } from './types';

/** A column by its header text (case and surrounding spaces ignored) or by 0-based position. */
export type ColumnRef = string | number;

export interface StatementColumnMapping {
  date: ColumnRef;
  reference?: ColumnRef;
  /** One signed amount column … */
  amount?: ColumnRef;
  /** … or two columns: amount = credit − debit; a row fills one of them. */
  credit?: ColumnRef;
  debit?: ColumnRef;
  currency?: ColumnRef;
  dealerId?: ColumnRef;
}

export type StatementDateFormat = 'YYYY-MM-DD' | 'DD.MM.YYYY' | 'DD/MM/YYYY' | 'MM/DD/YYYY';

export interface StatementCsvOptions {
  mapping: StatementColumnMapping;
  /** The statement's currency; a mapped currency column may name it per row. */
  currency: CurrencyCode;
  decimalSeparator?: DecimalSeparator;
  dateFormat?: StatementDateFormat;
  /** Default true. Without a header, columns are referred to by position. */
  hasHeader?: boolean;
  /** Flip every sign: for a dealer whose books show the brand's credits as negatives. */
  negate?: boolean;
  /** Default dealer for rows without a dealer column. */
  dealerId?: string;
}

/** `row` counts CSV records from 1, the header being row 1; `column` is the header text or "#n". */
export interface StatementRowError {
  row: number;
  column?: string;
  field?: keyof StatementColumnMapping;
  message: string;
}

export type ParseStatementResult = { ok: true; lines: StatementLine[] } | { ok: false; errors: StatementRowError[] };

const DATE_PATTERNS: Record<StatementDateFormat, { re: RegExp; order: [number, number, number] }> = {
  'YYYY-MM-DD': { re: /^(\d{4})-(\d{2})-(\d{2})$/, order: [1, 2, 3] },
  'DD.MM.YYYY': { re: /^(\d{1,2})\.(\d{1,2})\.(\d{4})$/, order: [3, 2, 1] },
  'DD/MM/YYYY': { re: /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/, order: [3, 2, 1] },
  'MM/DD/YYYY': { re: /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/, order: [3, 1, 2] },
};

/**
 * Reads a dealer statement CSV into statement lines, all or nothing: if any row has a problem the
 * result is only the list of errors (row, column, what is wrong), never a partial set of lines.
 * Blank rows are skipped. The delimiter is detected (comma, semicolon, tab …) by papaparse.
 */
export function parseStatementCsv(text: string, options: StatementCsvOptions): ParseStatementResult {
  const { mapping } = options;
  const hasHeader = options.hasHeader ?? true;
  const dateFormat = options.dateFormat ?? 'YYYY-MM-DD';
  const errors: StatementRowError[] = [];
  const fail = (): ParseStatementResult => ({ ok: false, errors });

  if (mapping.amount === undefined && mapping.credit === undefined && mapping.debit === undefined) {
    errors.push({ row: 0, field: 'amount', message: 'the mapping names no amount column (amount, or credit and/or debit)' });
  }
  if (mapping.amount !== undefined && (mapping.credit !== undefined || mapping.debit !== undefined)) {
    errors.push({ row: 0, field: 'amount', message: 'map either one amount column or credit/debit columns, not both' });
  }
  if (errors.length) return fail();

  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false });
  for (const e of parsed.errors) {
    // A one-column file has no delimiter to detect; papaparse then reads it as comma-separated.
    if (e.code === 'UndetectableDelimiter') continue;
    errors.push({ row: (e.row ?? 0) + 1, message: `the CSV cannot be read here: ${e.message}` });
  }
  if (errors.length) return fail();
  const records = parsed.data;

  const header = hasHeader ? (records[0] ?? []).map((h) => h.trim()) : [];
  const columns = new Map<keyof StatementColumnMapping, { index: number; name: string }>();
  for (const [field, ref] of Object.entries(mapping) as [keyof StatementColumnMapping, ColumnRef | undefined][]) {
    if (ref === undefined) continue;
    if (typeof ref === 'number') {
      if (!Number.isInteger(ref) || ref < 0) {
        errors.push({ row: 0, field, message: `column position ${ref} is not a whole number from 0` });
        continue;
      }
      columns.set(field, { index: ref, name: header[ref] || `#${ref + 1}` });
      continue;
    }
    if (!hasHeader) {
      errors.push({ row: 0, field, message: `column "${ref}" is named, but the file is read without a header row; give a position` });
      continue;
    }
    const index = header.findIndex((h) => h.toLowerCase() === ref.trim().toLowerCase());
    if (index < 0) {
      errors.push({ row: 1, column: ref, field, message: `no column "${ref}" in the header (columns: ${header.join(', ') || 'none'})` });
    } else columns.set(field, { index, name: header[index] as string });
  }
  if (errors.length) return fail();

  const lines: StatementLine[] = [];
  for (let r = hasHeader ? 1 : 0; r < records.length; r++) {
    const record = records[r] as string[];
    const row = r + 1;
    if (record.every((cell) => cell.trim() === '')) continue;
    const cell = (field: keyof StatementColumnMapping) => {
      const col = columns.get(field);
      return col === undefined ? undefined : (record[col.index] ?? '').trim();
    };
    const err = (field: keyof StatementColumnMapping, message: string) =>
      errors.push({ row, column: columns.get(field)?.name, field, message });
    const before = errors.length;

    for (const [field, col] of columns) {
      if (col.index >= record.length) err(field, `the row has ${record.length} fields, so column ${col.name} is missing`);
    }
    if (errors.length > before) continue;

    const currencyText = cell('currency');
    let currency: CurrencyCode = options.currency;
    if (currencyText) {
      const code = currencyText.toUpperCase();
      if (isCurrencyCode(code)) currency = code;
      else err('currency', `"${currencyText}" is not a supported ISO 4217 currency code`);
    }

    const reference = cell('reference') ?? '';
    const amount = readAmount(cell, currency, options.decimalSeparator, err, reference === '');

    const dateText = cell('date') ?? '';
    let date: string | undefined;
    if (dateText === '') err('date', 'the date is empty');
    else {
      date = readDate(dateText, dateFormat);
      if (date === undefined) err('date', `"${dateText}" is not a real date in the form ${dateFormat}`);
    }

    if (errors.length > before || amount === undefined || date === undefined) continue;
    const dealerId = cell('dealerId') || options.dealerId;
    lines.push({
      lineNo: row,
      ...(reference ? { reference } : {}),
      amountMinor: options.negate ? negateMinor(amount) : amount,
      date,
      currency,
      ...(dealerId ? { dealerId } : {}),
    });
  }
  if (errors.length) return fail();
  if (lines.length === 0) return { ok: false, errors: [{ row: 0, message: 'the file has no statement lines' }] };
  return { ok: true, lines };
}

function readAmount(
  cell: (f: keyof StatementColumnMapping) => string | undefined,
  currency: CurrencyCode,
  decimalSeparator: DecimalSeparator | undefined,
  err: (f: keyof StatementColumnMapping, m: string) => void,
  noReference: boolean,
): MinorUnits | undefined {
  const parse = (field: 'amount' | 'credit' | 'debit', t: string) => {
    const p = parseAmount(t, { currency, decimalSeparator: decimalSeparator ?? '.' });
    if (!p.ok) err(field, p.message);
    return p.ok ? p.value : undefined;
  };
  const missing = noReference ? 'the row has neither a reference nor an amount' : 'the amount is empty';
  const single = cell('amount');
  if (single !== undefined) {
    if (single !== '') return parse('amount', single);
    err('amount', missing);
    return undefined;
  }
  const credit = cell('credit') ?? '';
  const debit = cell('debit') ?? '';
  if (credit === '' && debit === '') {
    err(cell('credit') !== undefined ? 'credit' : 'debit', missing);
    return undefined;
  }
  if (credit !== '' && debit !== '') {
    err('credit', 'both the credit and the debit column are filled; fill one');
    return undefined;
  }
  const c = credit === '' ? 0 : parse('credit', credit);
  const d = debit === '' ? 0 : parse('debit', debit);
  if (c === undefined || d === undefined) return undefined;
  return addMinor(c, negateMinor(d));
}

function readDate(text: string, format: StatementDateFormat): string | undefined {
  const { re, order } = DATE_PATTERNS[format];
  const m = re.exec(text);
  if (!m) return undefined;
  const [y, mo, d] = order.map((i) => m[i] as string) as [string, string, string];
  const iso = `${y}-${mo.padStart(2, '0')}-${d.padStart(2, '0')}`;
  return isIsoDate(iso) ? iso : undefined;
}
