import type { ChargebackReason } from './types';

/** Our wording for each chargeback, and whether it also takes back the labor credited. */
export const CHARGEBACK_RULES: Record<ChargebackReason, { label: string; takesBackLabor: boolean }> = {
  // The repair was unnecessary: the dealer pays for the part it received and keeps no labor.
  no_fault_found: { label: 'No fault found at inspection', takesBackLabor: true },
  // The repair was real; only the missing core is the dealer's loss.
  core_not_returned: { label: 'Core not returned in time', takesBackLabor: false },
  // The warranty never applied: like no fault found.
  not_covered_at_inspection: { label: 'Damage not covered, found at inspection', takesBackLabor: true },
};
