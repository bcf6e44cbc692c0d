import Papa from 'papaparse';
import { bignumber } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { adjustLine, computeCredit, reverseMemo } from '@/lib/credits';
import { MEMO_EXPORT_COLUMNS, csvField, csvRecord, exportMemosCsv, type MemoForExport } from '@/lib/reports';

const draft = computeCredit({
  currency: 'USD',
  priceDate: '2025-03-01',
  priceList: [{ partNumber: 'CTL-36V-20A', dealerNetMinor: 14250, effectiveFrom: '2025-01-01' }],
  parts: [{ partNumber: 'CTL-36V-20A', description: 'Controller, 36 V "compact"', category: 'controller', requestedQuantity: 2, approvedQuantity: 2, source: 'dealer_stock' }],
  labor: [{ code: 'C-1', description: '=replace controller\nand test', scheduledHours: '0.25', approvedHours: '0.25' }],
  laborRates: { dealerRateMinor: 10, brandMaxRateMinor: 8000 },
  laborRelease: { state: 'verified_by_test' },
  freight: { approvedMinor: 1000 },
});
const memo: MemoForExport = {
  ...adjustLine(draft, { lineNo: 3, amountMinor: 800, reason: 'invoice, 8.00', by: 'acc-1', at: '2025-03-21T09:00:00Z' }),
  number: 'CM-2025-000001-3',
  issuedOn: '2025-03-21',
  dealerId: 'D-NORTH',
  dealerAccount: 'ACC-10442',
  claimNumber: 'WC-2025-000123-5',
  rmaNumber: null,
};
const reversal: MemoForExport = { ...reverseMemo(memo, 'wrong account'), number: 'CM-2025-000002-1', issuedOn: '2025-03-22', dealerId: 'D-NORTH', dealerAccount: 'ACC-10442', claimNumber: 'WC-2025-000123-5' };

describe('RFC 4180 writing', () => {
  it('quotes and doubles quotes as in RFC 4180 §2 rule 7 ("aaa","b""bb","ccc")', () => {
    expect(csvField('b"bb')).toBe('"b""bb"');
    expect(csvRecord(['aaa', 'b"bb', 'ccc'])).toBe('aaa,"b""bb",ccc\r\n');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField(' padded')).toBe('" padded"');
    expect(csvField('-12.30')).toBe('-12.30');
  });
});

describe('memo lines export', () => {
  const text = exportMemosCsv([memo, reversal]);
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });

  it('is read back by papaparse (an independent RFC 4180 reader) without errors, header first', () => {
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...MEMO_EXPORT_COLUMNS]);
    expect(parsed.data).toHaveLength(6);
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.split('\r\n')[0]).toBe(MEMO_EXPORT_COLUMNS.join(','));
  });

  it('writes plain dot decimals, ISO dates and the line basis', () => {
    const [part, labor, freight] = parsed.data;
    expect(part).toMatchObject({
      memo_number: 'CM-2025-000001-3',
      memo_date: '2025-03-21',
      line_kind: 'part',
      quantity: '2',
      unit_amount: '142.50',
      line_amount: '285.00',
      description: 'Controller, 36 V "compact" — fitted from dealer stock',
      rma_number: '',
    });
    expect(labor).toMatchObject({ hours: '0.25', unit_amount: '0.10', line_amount: '0.03', description: "'=replace controller\nand test" });
    expect(freight).toMatchObject({ computed_amount: '10.00', line_amount: '8.00', adjustment_reason: 'invoice, 8.00' });
  });

  it("each memo's line amounts add up to its total (summed with decimal.js through mathjs)", () => {
    for (const number of ['CM-2025-000001-3', 'CM-2025-000002-1']) {
      const rows = parsed.data.filter((r) => r.memo_number === number);
      const sum = rows.reduce((acc, r) => acc.plus(bignumber(r.line_amount!)), bignumber(0));
      expect(sum.toFixed(2)).toBe(rows[0]!.memo_total);
    }
    expect(parsed.data.filter((r) => r.memo_kind === 'reversal').map((r) => [r.reverses_memo, r.line_amount])).toEqual([
      ['CM-2025-000001-3', '-285.00'],
      ['CM-2025-000001-3', '-0.03'],
      ['CM-2025-000001-3', '-8.00'],
    ]);
  });

  it('writes JPY without decimals and refuses a memo whose total does not foot', () => {
    const yen = computeCredit({
      currency: 'JPY',
      priceDate: '2025-03-01',
      priceList: [],
      parts: [],
      labor: [{ code: 'B', description: 'Battery swap', scheduledHours: '0.5', approvedHours: '0.5' }],
      laborRates: { dealerRateMinor: 3333, brandMaxRateMinor: 5000 },
      laborRelease: { state: 'verified_by_test' },
    });
    const out = exportMemosCsv([{ ...yen, number: 'CM-2025-000009-6', issuedOn: '2025-03-01', dealerId: 'D-EAST', dealerAccount: 'A-1', claimNumber: 'WC-2025-000009-6' }]);
    expect(Papa.parse<Record<string, string>>(out, { header: true, skipEmptyLines: true }).data[0]).toMatchObject({ line_amount: '1667', currency: 'JPY' });
    expect(() => exportMemosCsv([{ ...memo, totalMinor: memo.totalMinor + 1 }])).toThrow(/memo CM-2025-000001-3: total .* is not the sum of its lines/);
  });
});
