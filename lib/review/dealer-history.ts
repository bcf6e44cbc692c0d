/**
 * A dealer's record with one brand, as the rep sees it next to a claim. Approval rate, stated
 * once: claims approved (in full or in part, including those since credited) divided by claims
 * decided (approved + denied); claims still open and withdrawn claims do not count. Null when
 * nothing has been decided yet, so a new dealer is not shown a rate of 0 %.
 */
export type DealerRecord = { filed: number; open: number; approved: number; denied: number; withdrawn: number };

export function approvalRate(r: Pick<DealerRecord, 'approved' | 'denied'>): number | null {
  const decided = r.approved + r.denied;
  return decided === 0 ? null : r.approved / decided;
}

/** "83 % (5 of 6 decided)" or "no decisions yet". */
export function approvalRateText(r: Pick<DealerRecord, 'approved' | 'denied'>): string {
  const rate = approvalRate(r);
  if (rate === null) return 'no decisions yet';
  return `${Math.round(rate * 100)} % (${r.approved} of ${r.approved + r.denied} decided)`;
}

export const APPROVAL_RATE_RULE = 'Approved (in full or in part) out of decided (approved + denied); open and withdrawn claims do not count.';
