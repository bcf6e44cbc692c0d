import { describe, expect, it } from 'vitest';
import { suggestMapping, toColumnMapping } from '@/lib/reconciliation/suggest-mapping';

describe('first guess at a statement’s columns', () => {
  it('reads common English and German headers, ignoring case, spaces and accents', () => {
    expect(suggestMapping(['Buchungsdatum', 'Verwendungszweck', 'Betrag', 'Währung'])).toEqual({ date: 'Buchungsdatum', reference: 'Verwendungszweck', amount: 'Betrag', currency: 'Währung' });
    expect(suggestMapping(['Posting Date', 'Doc No', 'Credit', 'Debit', 'Account Number'])).toEqual({ date: 'Posting Date', reference: 'Doc No', credit: 'Credit', debit: 'Debit', account: 'Account Number' });
  });

  it('prefers one signed amount column over credit/debit, unless the source used credit/debit before', () => {
    expect(suggestMapping(['Date', 'Amount', 'Credit'])).toEqual({ date: 'Date', amount: 'Amount' });
    expect(suggestMapping(['Date', 'Amount', 'Credit'], { credit: 'Credit' })).toEqual({ date: 'Date', credit: 'Credit' });
  });

  it('a remembered mapping wins for the headers the file still has', () => {
    expect(suggestMapping(['When', 'Memo', 'Sum'], { date: 'when', reference: 'Memo', amount: 'Total' })).toEqual({ date: 'When', reference: 'Memo', amount: 'Sum' });
  });

  it('turns into the parser’s mapping; without a date column there is none', () => {
    expect(toColumnMapping({ date: 'D', amount: 'A', account: 'K' })).toEqual({ date: 'D', amount: 'A', dealerId: 'K' });
    expect(toColumnMapping({ amount: 'A' })).toBeNull();
  });
});
