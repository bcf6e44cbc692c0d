/** Why a file was refused, or what a dealer should know about how it was read. */
export type IssueCode =
  | 'too-large'
  | 'empty-file'
  | 'not-text'
  | 'not-utf8'
  | 'no-header'
  | 'duplicate-header'
  | 'mixed-decimal-marks'
  | 'wrong-field-count'
  | 'bad-quotes'
  | 'missing-value'
  | 'not-a-number'
  | 'negative-value'
  | 'all-zero'
  | 'too-few-samples'
  | 'missing-column'
  | 'duplicate-quantity'
  | 'mapping-unknown-column'
  | 'mapping-invalid'
  | 'column-ignored'
  | 'time-out-of-order'
  | 'time-repeated'
  | 'current-sign-flipped'
  | 'charge-current'
  | 'derived-quantity'
  | 'more-errors';

export interface LoadtestIssue {
  readonly code: IssueCode;
  /** Plain words for the dealer: what is wrong, where, and what to do. */
  readonly message: string;
  /** 1-based line of the file. */
  readonly row?: number;
  /** Further 1-based lines, for warnings that cover many samples (at most `MAX_LISTED_ROWS`). */
  readonly rows?: readonly number[];
  /** How many rows the issue covers in total, when `rows` is cut short. */
  readonly rowCount?: number;
  /** Column header as written in the file. */
  readonly column?: string;
  /** 1-based column position. */
  readonly columnNumber?: number;
}

/** How many row numbers a warning lists before it just counts. */
export const MAX_LISTED_ROWS = 20;
/** How many errors an import reports before it stops listing them. */
export const MAX_REPORTED_ERRORS = 20;

export function listRows(rows: readonly number[]): string {
  const shown = rows.slice(0, MAX_LISTED_ROWS).join(', ');
  return rows.length > MAX_LISTED_ROWS ? `${shown} and ${rows.length - MAX_LISTED_ROWS} more` : shown;
}

export function columnRef(header: string, columnNumber: number): string {
  return header.trim() === '' ? `column ${columnNumber}` : `column ${columnNumber} "${header.trim()}"`;
}
