// Failed sign-ins for one e-mail: after MAX_FAILURES inside WINDOW_MINUTES the e-mail is
// locked for LOCK_MINUTES. Counting per e-mail (also unknown ones) keeps the answer the
// same whether or not an account exists.
export const MAX_FAILURES = 5;
export const WINDOW_MINUTES = 15;
export const LOCK_MINUTES = 15;

export type ThrottleRow = { failures: number; windowStartedAt: Date; lockedUntil: Date | null };

export function lockRemainingMinutes(row: ThrottleRow | null, now: Date): number {
  if (!row?.lockedUntil || row.lockedUntil <= now) return 0;
  return Math.ceil((row.lockedUntil.getTime() - now.getTime()) / 60_000);
}

/** The row after one more failure at `now`. */
export function afterFailure(row: ThrottleRow | null, now: Date): ThrottleRow {
  // A failure during a lock (a guess already in flight when it began) keeps the lock as it is.
  if (row?.lockedUntil && row.lockedUntil > now) return row;
  const windowOpen = row && now.getTime() - row.windowStartedAt.getTime() < WINDOW_MINUTES * 60_000;
  const failures = windowOpen ? row.failures + 1 : 1;
  const windowStartedAt = windowOpen ? row.windowStartedAt : now;
  const lockedUntil = failures >= MAX_FAILURES ? new Date(now.getTime() + LOCK_MINUTES * 60_000) : null;
  return { failures: lockedUntil ? 0 : failures, windowStartedAt: lockedUntil ? now : windowStartedAt, lockedUntil };
}

export function lockedMessage(minutes: number): string {
  return `Too many failed sign-ins for this e-mail. It is locked for ${minutes} more minute${minutes === 1 ? '' : 's'}; try again then, or ask your admin to check the account.`;
}
