import 'server-only';
import { db } from '@/db/connection';
import type { ThrottleRow } from '@/lib/auth/throttle';

export async function getThrottle(email: string): Promise<ThrottleRow | null> {
  const row = await db()('signin_throttle')
    .select('failures', 'window_started_at as windowStartedAt', 'locked_until as lockedUntil')
    .where({ email: email.toLowerCase() })
    .first();
  return row ?? null;
}

/**
 * Counts one failed sign-in under a row lock, so guesses sent in parallel each count (read,
 * then write, without the lock would let them all write the same "one more").
 */
export async function recordFailure(emailInput: string, now: Date, next: (row: ThrottleRow | null) => ThrottleRow): Promise<ThrottleRow> {
  const email = emailInput.toLowerCase();
  return db().transaction(async (trx) => {
    await trx('signin_throttle').insert({ email, failures: 0, window_started_at: now, locked_until: null }).onConflict('email').ignore();
    const row = (await trx('signin_throttle')
      .select('failures', 'window_started_at as windowStartedAt', 'locked_until as lockedUntil')
      .where({ email })
      .forUpdate()
      .first()) as ThrottleRow;
    // A row just created for this failure has nothing to carry over.
    const updated = next(row.failures === 0 && !row.lockedUntil ? null : row);
    await trx('signin_throttle').where({ email }).update({ failures: updated.failures, window_started_at: updated.windowStartedAt, locked_until: updated.lockedUntil });
    return updated;
  });
}

export async function clearThrottle(email: string): Promise<void> {
  await db()('signin_throttle').where({ email: email.toLowerCase() }).delete();
}
