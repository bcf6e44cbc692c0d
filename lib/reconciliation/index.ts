export { matchStatement } from './match-statement';
export { MIN_REFERENCE_KEY_LENGTH, ReferenceIndex, normalizeReference, type ReferenceHit } from './reference-index';
export {
  parseStatementCsv,
  type ColumnRef,
  type ParseStatementResult,
  type StatementColumnMapping,
  type StatementCsvOptions,
  type StatementDateFormat,
  type StatementRowError,
} from './parse-statement-csv';
export {
  AGING_BUCKETS,
  AGING_BUCKET_LABELS,
  ageOpenItems,
  agingBucket,
  type AgingBucket,
  type AgingReport,
  type AgingRow,
  type BucketTotals,
  type OpenItem,
} from './aging';
export { ReconciliationInputError } from './input-error';
export type {
  AmbiguityReason,
  AmbiguousLine,
  Candidate,
  MatchBasis,
  MatchOptions,
  MatchResult,
  MemoForMatching,
  ProposedMatch,
  ReferenceField,
  StatementLine,
  UnmatchedLine,
  UnmatchedReason,
} from './types';
