// The claim's request lines (what the dealer asked for) and the rep's approved lines share one
// shape, stored as jsonb in `claims.requested_lines` and `claims.approved_lines`.
export type PartLine = { lineId: string; partId: string; partNumber: string; name: string; quantity: number; fromDealerStock: boolean };
export type LaborLine = { lineId: string; operationId: string; code: string; description: string; hours: string };
export type ClaimLines = { parts: PartLine[]; labor: LaborLine[]; freightMinor: number };

/** The line id the freight allowance has in an approval (parts are p1…, labor l1…). */
export const FREIGHT_LINE_ID = 'freight';

/**
 * Hours as whole hundredths, exactly: "1.20" → 120, "0.5" → 50. Null when the text is not a
 * non-negative decimal with at most two places (the schedule's precision).
 */
export function hundredthsOf(hours: string | number): number | null {
  const text = typeof hours === 'number' ? String(hours) : hours.trim();
  const m = /^(\d{1,3})(?:\.(\d{1,2}))?$/.exec(text);
  if (!m) return null;
  return Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0'));
}

/** 120 → "1.20": the form the labor schedule stores. */
export function hoursText(hundredths: number): string {
  return `${Math.floor(hundredths / 100)}.${String(hundredths % 100).padStart(2, '0')}`;
}
