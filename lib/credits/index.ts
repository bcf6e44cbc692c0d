export { computeChargebackMemo, computeCredit } from './compute-credit';
export { adjustLine, type LineEdit } from './adjust-line';
export { reverseMemo } from './reverse-memo';
export { describeBasis } from './describe-basis';
export { CHARGEBACK_RULES } from './chargeback-reasons';
export { findPriceOn } from './price-list';
export { memoTotal } from './build-lines';
export {
  chargebackInputSchema,
  creditInputSchema,
  validateChargebackInput,
  validateCreditInput,
} from './credit-input-schema';
export { CreditInputError, type CreditInputIssue } from './credit-input-error';
export {
  formatClaimNumber,
  formatCreditMemoNumber,
  formatRmaNumber,
  parseDocumentNumber,
  type DocumentKind,
  type DocumentNumberParts,
  type ParsedDocumentNumber,
} from './document-numbers';
export { isLuhnValid, luhnCheckDigit } from './check-digit';
export type {
  ApprovedPart,
  ChargebackInput,
  ChargebackReason,
  ChargebackRequest,
  CreditInput,
  CreditLine,
  CreditLineKind,
  CreditLineStatus,
  CreditMemoDraft,
  CreditMemoKind,
  FreightAllowance,
  LaborOperation,
  LaborRates,
  LaborRelease,
  LineAdjustment,
  LineBasis,
  PartSource,
  PriceListEntry,
} from './types';
