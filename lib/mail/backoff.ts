// Retry delays for mail that could not be handed to the mail server: doubling from 5 s,
// capped at 10 minutes, and never giving up — a queued mail is never dropped.
export function retryDelaySeconds(attempts: number): number {
  return Math.min(600, 5 * 2 ** Math.max(0, attempts - 1));
}
