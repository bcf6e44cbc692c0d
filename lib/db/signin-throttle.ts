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

export async function saveThrottle(email: string, row: ThrottleRow): Promise<void> {
  await db()('signin_throttle')
    .insert({ email: email.toLowerCase(), failures: row.failures, window_started_at: row.windowStartedAt, locked_until: row.lockedUntil })
    .onConflict('email')
    .merge();
}

export async function clearThrottle(email: string): Promise<void> {
  await db()('signin_throttle').where({ email: email.toLowerCase() }).delete();
}
