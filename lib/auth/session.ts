import 'server-only';
import { notFound, redirect } from 'next/navigation';
import { cache } from 'react';
import { sessionUserId } from '@/lib/auth/session-id';
import type { Role } from '@/lib/auth/roles';
import { findActiveUser, type AppUser } from '@/lib/db/users';

/**
 * The signed-in user, read fresh from the database once per request so that a disabled
 * account or a changed role takes effect at once, whatever the session cookie says.
 */
export const currentUser = cache(async (): Promise<AppUser | null> => {
  const id = await sessionUserId();
  if (!id) return null;
  return findActiveUser(id);
});

/** For pages and server actions: no session → the sign-in page. */
export async function requireUser(): Promise<AppUser> {
  const user = await currentUser();
  if (!user) redirect('/signin');
  return user;
}

/** For pages and server actions: a role that may not see this → 404, as if it did not exist. */
export async function requireRole(...roles: Role[]): Promise<AppUser> {
  const user = await requireUser();
  if (!roles.includes(user.role)) notFound();
  return user;
}
