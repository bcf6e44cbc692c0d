import 'server-only';
import bcrypt from 'bcryptjs';
import { afterFailure, lockedMessage, lockRemainingMinutes } from '@/lib/auth/throttle';
import { clearThrottle, getThrottle, recordFailure } from '@/lib/db/signin-throttle';
import { findUserForSignIn, type AppUser } from '@/lib/db/users';

export const WRONG_CREDENTIALS = 'That e-mail and password do not match an account. Check both and try again.';
export const DISABLED_ACCOUNT = 'This account has been switched off by your admin. Ask them to turn it back on.';

// Compared against when the e-mail is unknown, so both paths take about as long.
const DUMMY_HASH = '$2b$10$30tmtu97fuJ81G1Cv7H1j.uWfmLf6FTZluexkM00r/R9QST5irUCW';

export type SignInResult = { ok: true; user: AppUser } | { ok: false; message: string };

export async function verifyCredentials(emailInput: string, password: string, now = new Date()): Promise<SignInResult> {
  const email = emailInput.trim().toLowerCase();
  if (!email || !password) return { ok: false, message: 'Enter your e-mail and password.' };

  const throttle = await getThrottle(email);
  const locked = lockRemainingMinutes(throttle, now);
  if (locked > 0) return { ok: false, message: lockedMessage(locked) };

  const found = await findUserForSignIn(email);
  const matches = await bcrypt.compare(password, found?.passwordHash ?? DUMMY_HASH);
  if (!found || !found.passwordHash || !matches) {
    const next = await recordFailure(email, now, (row) => afterFailure(row, now));
    if (next.lockedUntil) return { ok: false, message: lockedMessage(lockRemainingMinutes(next, now)) };
    return { ok: false, message: WRONG_CREDENTIALS };
  }
  if (found.disabledAt) return { ok: false, message: DISABLED_ACCOUNT };

  await clearThrottle(email);
  const { passwordHash: _hash, disabledAt: _disabled, ...user } = found;
  return { ok: true, user };
}
