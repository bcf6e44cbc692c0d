export {
  warrantyCost,
  type CostBreakdown,
  type CostGrouping,
  type MemoForCostReport,
  type ShipmentAtCost,
  type WarrantyCostInput,
  type WarrantyCostReport,
  type WarrantyCostRow,
} from './warranty-cost';
export {
  liabilityRollForward,
  type LiabilityMovement,
  type LiabilityMovementKind,
  type RollForward,
  type RollForwardInput,
  type RollForwardLine,
} from './liability-roll-forward';
export { expectedCost, type ExpectedCost, type WarrantyOutcome } from './expected-cost';
export { MEMO_EXPORT_COLUMNS, MEMO_EXPORT_LAYOUT, exportMemosCsv, type MemoForExport } from './memo-csv-export';
export { csvField, csvRecord, defuseFormula } from './csv-write';
export { ReportInputError } from './report-input-error';
