import type { StatementColumnMapping } from './parse-statement-csv';

/** The fields a statement column can be mapped to, and what each means on screen. */
export const STATEMENT_FIELDS = ['date', 'reference', 'amount', 'credit', 'debit', 'currency', 'account'] as const;
export type StatementField = (typeof STATEMENT_FIELDS)[number];

export const STATEMENT_FIELD_LABELS: Record<StatementField, string> = {
  date: 'Date',
  reference: 'Reference (memo, claim or RMA number)',
  amount: 'Amount (signed)',
  credit: 'Credit',
  debit: 'Debit',
  currency: 'Currency code',
  account: 'Dealer account number',
};

/** A column choice by header text; `account` names the dealer's account number with the brand. */
export type HeaderMapping = Partial<Record<StatementField, string>>;

// Header words people use, in the languages of the demo shops' books; compared without case,
// spaces or punctuation. A first guess only: the accountant sees and corrects it.
const WORDS: Record<StatementField, string[]> = {
  date: ['date', 'datum', 'bookingdate', 'postingdate', 'valuedate', 'buchungsdatum', 'fecha', 'transactiondate'],
  reference: ['reference', 'ref', 'memo', 'memonumber', 'document', 'documentnumber', 'docno', 'description', 'text', 'buchungstext', 'verwendungszweck', 'referenz', 'belegnummer', 'beleg', 'details', 'narrative'],
  amount: ['amount', 'betrag', 'value', 'net', 'total', 'sum', 'importe'],
  credit: ['credit', 'cr', 'haben', 'gutschrift', 'paidin', 'credits'],
  debit: ['debit', 'dr', 'soll', 'lastschrift', 'paidout', 'debits'],
  currency: ['currency', 'ccy', 'cur', 'wahrung', 'wahrungscode', 'currencycode'],
  account: ['account', 'accountnumber', 'dealeraccount', 'customer', 'customernumber', 'kundennummer', 'konto', 'debitor'],
};

const squash = (s: string) =>
  s
    .normalize('NFD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]/g, '');

/**
 * A first guess at the mapping from header texts. A remembered mapping of the same source wins
 * for every header it names that the file still has. Amount and credit/debit exclude each other:
 * one signed amount column is preferred.
 */
export function suggestMapping(headers: readonly string[], remembered?: HeaderMapping): HeaderMapping {
  const present = new Map(headers.map((h) => [h.trim().toLowerCase(), h]));
  const out: HeaderMapping = {};
  const used = new Set<string>();
  if (remembered) {
    for (const f of STATEMENT_FIELDS) {
      const h = remembered[f];
      const actual = h === undefined ? undefined : present.get(h.trim().toLowerCase());
      if (actual !== undefined) {
        out[f] = actual;
        used.add(actual);
      }
    }
  }
  for (const f of STATEMENT_FIELDS) {
    if (out[f] !== undefined) continue;
    const hit = headers.find((h) => !used.has(h) && WORDS[f].includes(squash(h)));
    if (hit !== undefined) {
      out[f] = hit;
      used.add(hit);
    }
  }
  if (out.amount !== undefined && (out.credit !== undefined || out.debit !== undefined)) {
    if (remembered?.credit !== undefined || remembered?.debit !== undefined) delete out.amount;
    else {
      delete out.credit;
      delete out.debit;
    }
  }
  return out;
}

/** The parser's mapping for a header mapping (account numbers travel in the dealer column). */
export function toColumnMapping(m: HeaderMapping): StatementColumnMapping | null {
  if (m.date === undefined) return null;
  return {
    date: m.date,
    ...(m.reference !== undefined ? { reference: m.reference } : {}),
    ...(m.amount !== undefined ? { amount: m.amount } : {}),
    ...(m.credit !== undefined ? { credit: m.credit } : {}),
    ...(m.debit !== undefined ? { debit: m.debit } : {}),
    ...(m.currency !== undefined ? { currency: m.currency } : {}),
    ...(m.account !== undefined ? { dealerId: m.account } : {}),
  };
}
