/**
 * The appeal window, stated once: the dealer may appeal a denial once, until the same time of day
 * `appeal_days` calendar days after the denial (the brand policy for the part's category;
 * {@link DEFAULT_APPEAL_DAYS} without one). Calendar days, not business days: the dealer's window is
 * long enough that weekends need no special rule.
 */
export const DEFAULT_APPEAL_DAYS = 30;

const DAY_MS = 24 * 60 * 60 * 1000;

export function appealWindowEnd(deniedAt: string, appealDays: number | null): string {
  const days = appealDays ?? DEFAULT_APPEAL_DAYS;
  if (!Number.isSafeInteger(days) || days < 1) throw new RangeError(`appealDays: ${days} must be a whole number of days from 1`);
  const t = Date.parse(deniedAt);
  if (Number.isNaN(t)) throw new RangeError(`deniedAt: ${deniedAt} is not a timestamp`);
  return new Date(t + days * DAY_MS).toISOString();
}
