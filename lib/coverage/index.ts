export {
  EXCLUSION_CODES,
  EXCLUSION_LABELS,
  PART_CATEGORIES,
  PART_CATEGORY_LABELS,
  type CoveragePolicy,
  type ExclusionCode,
  type PartCategory,
} from './policy';
export { CoverageInputError } from './input-error';
export { coverageInputSchema, coveragePolicySchema } from './schema';
export { COVERAGE_PERIOD_RULE_TEXT, coverageEndDate, coveragePeriod, type CoveragePeriod } from './coverage-period';
export {
  assessCoverage,
  type CoverageAssessment,
  type CoverageInput,
  type CoverageReason,
  type ReasonCode,
  type ReasonOutcome,
} from './assess-coverage';
