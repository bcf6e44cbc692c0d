import { isLuhnValid, luhnCheckDigit } from './check-digit';

/**
 * Our number formats, one shape for the three documents a claim produces:
 *
 *   WC-2025-000123-5    warranty claim
 *   RMA-2025-000042-7   return authorisation (RMA) for the replacement and its core
 *   CM-2025-001337-0    credit memo (credits, chargebacks and reversals share the series)
 *
 * PREFIX-YEAR-SEQUENCE-CHECK: the year the document was created, a sequence per brand and year
 * (zero-padded to six digits, longer if ever needed) and a Luhn check digit over year + sequence,
 * so a mistyped number is caught before it is searched for or matched on a statement.
 * Numbers are unique per brand; the database keys them by (brand, number).
 */
export type DocumentKind = 'claim' | 'rma' | 'credit_memo';

const PREFIX: Record<DocumentKind, string> = { claim: 'WC', rma: 'RMA', credit_memo: 'CM' };
const KIND_OF_PREFIX = new Map(Object.entries(PREFIX).map(([k, p]) => [p, k as DocumentKind]));

export interface DocumentNumberParts {
  year: number;
  sequence: number;
}

function formatNumber(kind: DocumentKind, { year, sequence }: DocumentNumberParts): string {
  if (!Number.isInteger(year) || year < 2000 || year > 9999) {
    throw new RangeError(`year: ${year} is not a four-digit year from 2000`);
  }
  if (!Number.isSafeInteger(sequence) || sequence < 1) {
    throw new RangeError(`sequence: ${sequence} must be a whole number from 1`);
  }
  const seq = String(sequence).padStart(6, '0');
  return `${PREFIX[kind]}-${year}-${seq}-${luhnCheckDigit(`${year}${seq}`)}`;
}

export function formatClaimNumber(parts: DocumentNumberParts): string {
  return formatNumber('claim', parts);
}

export function formatRmaNumber(parts: DocumentNumberParts): string {
  return formatNumber('rma', parts);
}

export function formatCreditMemoNumber(parts: DocumentNumberParts): string {
  return formatNumber('credit_memo', parts);
}

export type ParsedDocumentNumber =
  | ({ ok: true; kind: DocumentKind; canonical: string } & DocumentNumberParts)
  | { ok: false; message: string };

/**
 * Reads a document number as people write it: any case, with or without dashes or spaces
 * ("cm 2025 001337 0", "CM2025-0013370"). Refuses a wrong check digit.
 */
export function parseDocumentNumber(text: string): ParsedDocumentNumber {
  const compact = text.toUpperCase().replace(/[\s\-_./]/g, '');
  const m = /^(WC|RMA|CM)(\d{4})(\d{6,})(\d)$/.exec(compact);
  if (!m) {
    return { ok: false, message: `"${text}" is not a claim, RMA or credit memo number (like CM-2025-001337-0)` };
  }
  const [, prefix = '', yearText = '', seqText = '', check = ''] = m;
  if (!isLuhnValid(`${yearText}${seqText}${check}`)) {
    return { ok: false, message: `"${text}": the check digit does not match; the number is mistyped` };
  }
  const kind = KIND_OF_PREFIX.get(prefix);
  if (!kind) return { ok: false, message: `"${text}": unknown prefix ${prefix}` };
  const parts = { year: Number(yearText), sequence: Number(seqText) };
  return { ok: true, kind, ...parts, canonical: formatNumber(kind, parts) };
}
