import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { parseStatementCsv } from '@/lib/reconciliation';

// Statements are invented. Quoting follows RFC 4180 §2; papaparse (the reader) is the reference.
const mapping = { date: 'Date', reference: 'Reference', amount: 'Amount' };

describe('statement CSV', () => {
  it('reads lines with their row numbers (header = row 1), skipping blank rows', () => {
    const csv = 'Date,Reference,Amount\r\n2025-03-05,CM-2025-000001-3,"1,234.50"\r\n\r\n2025-03-06,,(45.00)\r\n';
    const r = parseStatementCsv(csv, { mapping, currency: 'USD', dealerId: 'D-NORTH' });
    expect(r).toEqual({
      ok: true,
      lines: [
        { lineNo: 2, reference: 'CM-2025-000001-3', amountMinor: 123450, date: '2025-03-05', currency: 'USD', dealerId: 'D-NORTH' },
        { lineNo: 4, amountMinor: -4500, date: '2025-03-06', currency: 'USD', dealerId: 'D-NORTH' },
      ],
    });
  });

  it('reads a semicolon file with comma decimals, day-first dates, credit/debit columns and a byte-order mark', () => {
    const csv = '\uFEFFBuchungstag;Text;Soll;Haben;Waehrung\n05.03.2025;CM 2025 000001 3;;1.234,50;EUR\n6.3.2025;Rueckbelastung;45,00;;eur\n';
    const r = parseStatementCsv(csv, {
      mapping: { date: 'buchungstag', reference: 'Text', debit: 'Soll', credit: 'Haben', currency: 'Waehrung' },
      currency: 'EUR',
      decimalSeparator: ',',
      dateFormat: 'DD.MM.YYYY',
    });
    expect(r.ok && r.lines.map((l) => [l.lineNo, l.date, l.amountMinor, l.currency])).toEqual([
      [2, '2025-03-05', 123450, 'EUR'],
      [3, '2025-03-06', -4500, 'EUR'],
    ]);
  });

  it('negates every sign when asked, and reads columns by position without a header', () => {
    const r = parseStatementCsv('03/07/2025,12.30,WC-2025-000123-5\n', {
      mapping: { date: 0, amount: 1, reference: 2 },
      hasHeader: false,
      currency: 'USD',
      dateFormat: 'MM/DD/YYYY',
      negate: true,
    });
    expect(r).toEqual({ ok: true, lines: [{ lineNo: 1, date: '2025-03-07', amountMinor: -1230, reference: 'WC-2025-000123-5', currency: 'USD' }] });
  });

  it('bad amounts and dates: every row error listed, and no lines at all', () => {
    const csv = [
      'Date,Reference,Amount,Note',
      '2025-03-05,CM-2025-000001-3,12.30', // good
      '2025-02-30,CM-2025-000002-1,12.30', // no such day
      '2025-03-07,CM-2025-000003-9,12.345', // too many decimals
      '05/03/2025,x,1.234,50', // wrong date form; unquoted comma splits the amount
      ',,,see attached', // neither reference nor amount, no date (a wholly blank row would be skipped)
      '2025-03-09,CM-2025-000004-7,', // no amount
      '2025-03-10,y,€5', // another currency's symbol
    ].join('\n');
    const r = parseStatementCsv(csv, { mapping, currency: 'USD' });
    expect(r.ok).toBe(false);
    expect(r).not.toHaveProperty('lines');
    if (r.ok) return;
    expect(r.errors).toEqual([
      { row: 3, column: 'Date', field: 'date', message: '"2025-02-30" is not a real date in the form YYYY-MM-DD' },
      { row: 4, column: 'Amount', field: 'amount', message: '"12.345" has 3 decimals, but USD has 2' },
      { row: 5, column: 'Amount', field: 'amount', message: '"1.234" has 3 decimals, but USD has 2' },
      { row: 5, column: 'Date', field: 'date', message: '"05/03/2025" is not a real date in the form YYYY-MM-DD' },
      { row: 6, column: 'Amount', field: 'amount', message: 'the row has neither a reference nor an amount' },
      { row: 6, column: 'Date', field: 'date', message: 'the date is empty' },
      { row: 7, column: 'Amount', field: 'amount', message: 'the amount is empty' },
      { row: 8, column: 'Amount', field: 'amount', message: 'the amount is marked "€" but this statement is in USD' },
    ]);
  });

  it('refuses a mapping to a missing column, naming the columns there are', () => {
    const r = parseStatementCsv('Date,Ref,Amount\n2025-03-05,a,1\n', { mapping, currency: 'USD' });
    expect(r).toEqual({
      ok: false,
      errors: [{ row: 1, column: 'Reference', field: 'reference', message: 'no column "Reference" in the header (columns: Date, Ref, Amount)' }],
    });
  });

  it('refuses short rows, both credit and debit filled, a bad currency code, and an empty file', () => {
    const short = parseStatementCsv('Date,Reference,Amount\n2025-03-05,a\n', { mapping, currency: 'USD' });
    expect(!short.ok && short.errors[0]?.message).toBe('the row has 2 fields, so column Amount is missing');
    const both = parseStatementCsv('Date,Cr,Dr\n2025-03-05,1.00,2.00\n', { mapping: { date: 'Date', credit: 'Cr', debit: 'Dr' }, currency: 'USD' });
    expect(!both.ok && both.errors[0]).toEqual({ row: 2, column: 'Cr', field: 'credit', message: 'both the credit and the debit column are filled; fill one' });
    const cur = parseStatementCsv('Date,Amount,Cur\n2025-03-05,1.00,Dollars\n', { mapping: { date: 'Date', amount: 'Amount', currency: 'Cur' }, currency: 'USD' });
    expect(!cur.ok && cur.errors[0]?.message).toBe('"Dollars" is not a supported ISO 4217 currency code');
    expect(parseStatementCsv('Date,Reference,Amount\n', { mapping, currency: 'USD' })).toEqual({ ok: false, errors: [{ row: 0, message: 'the file has no statement lines' }] });
    expect(parseStatementCsv('a,b\n', { mapping: { date: 'a' }, currency: 'USD' })).toMatchObject({ ok: false, errors: [{ field: 'amount' }] });
  });

  it('reads quoted fields with commas, quotes and line breaks (RFC 4180 §2 rules 6–7), written by papaparse', () => {
    const csv = Papa.unparse([
      ['Date', 'Reference', 'Amount'],
      ['2025-03-05', 'Paid "CM-2025-000001-3", thanks\nMarch run', '1,234.50'],
    ]);
    const r = parseStatementCsv(csv, { mapping, currency: 'USD' });
    expect(r.ok && r.lines[0]).toMatchObject({ lineNo: 2, reference: 'Paid "CM-2025-000001-3", thanks\nMarch run', amountMinor: 123450 });
  });

  it('reports an unreadable quote with its row', () => {
    const r = parseStatementCsv('Date,Reference,Amount\n2025-03-05,"open quote,1.00\n', { mapping, currency: 'USD' });
    expect(r.ok).toBe(false);
    expect(!r.ok && r.errors[0]?.message).toMatch(/^the CSV cannot be read here: /);
  });
});
