import type { IsoDate } from '@/lib/calendar';
import type { CurrencyCode, MinorUnits } from '@/lib/money';

/** One line of a dealer's statement, already parsed (see parseStatementCsv). */
export interface StatementLine {
  lineNo: number;
  reference?: string;
  amountMinor: MinorUnits;
  date: IsoDate;
  currency: CurrencyCode;
  dealerId?: string;
}

/** An issued credit memo as the matcher needs it. */
export interface MemoForMatching {
  id: string;
  number: string;
  claimNumber: string;
  rmaNumber?: string | null;
  dealerId: string;
  currency: CurrencyCode;
  totalMinor: MinorUnits;
  issuedOn: IsoDate;
}

export interface MatchOptions {
  /** Amount matching accepts a memo issued up to this many days before or after the line's date. */
  dateWindowDays: number;
  /** The dealer whose statement this is; lines without a dealerId take it. */
  statementDealerId?: string;
  /** How many candidates an ambiguous line lists (the count is always given). Default 10. */
  maxCandidatesListed?: number;
}

export type MatchBasis = 'reference' | 'amount_date';
export type ReferenceField = 'memo_number' | 'claim_number' | 'rma_number';

export interface ProposedMatch {
  lineNo: number;
  memoId: string;
  basis: MatchBasis;
  /** For a reference match: which of the memo's numbers the reference contained. */
  referenceField?: ReferenceField;
  /** Line amount − memo total; 0 for every amount match, possibly not for a reference match. */
  amountDifferenceMinor: MinorUnits;
  /** Line date − memo issue date, in days. */
  daysApart: number;
}

export interface Candidate {
  memoId: string;
  memoNumber: string;
  referenceField?: ReferenceField;
  daysApart: number;
}

/**
 * several_memos — the line fits more than one memo;
 * memo_wanted_by_several_lines — the line's only memo is also the only fit of another line.
 */
export type AmbiguityReason = 'several_memos' | 'memo_wanted_by_several_lines';

export interface AmbiguousLine {
  lineNo: number;
  basis: MatchBasis;
  reason: AmbiguityReason;
  candidates: Candidate[];
  candidateCount: number;
}

/**
 * no_candidate — no memo by reference, none of the same amount in the window;
 * reference_other_dealer / reference_other_currency — the reference names a memo that is refused;
 * no_dealer — no reference hit and no dealer to restrict amount matching to.
 */
export type UnmatchedReason = 'no_candidate' | 'reference_other_dealer' | 'reference_other_currency' | 'no_dealer';

export interface UnmatchedLine {
  lineNo: number;
  reason: UnmatchedReason;
}

export interface MatchResult {
  matches: ProposedMatch[];
  ambiguous: AmbiguousLine[];
  /** Every memo without a proposed match, oldest first (candidates of ambiguous lines included). */
  unmatchedMemos: string[];
  unmatchedLines: UnmatchedLine[];
}
