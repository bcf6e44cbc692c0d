import { db } from '@/db/connection';

let current: string | null = null;

export function actingUserId(): string | null {
  return current;
}

/** Acts as the user with this e-mail for the following calls; null signs out. */
export async function actAs(email: string | null): Promise<string | null> {
  if (!email) {
    current = null;
    return null;
  }
  const row = await db()('users').whereRaw('lower(email) = lower(?)', [email]).first('id');
  if (!row) throw new Error(`no user ${email}`);
  current = row.id;
  return current;
}

export async function userId(email: string): Promise<string> {
  const row = await db()('users').whereRaw('lower(email) = lower(?)', [email]).first('id');
  if (!row) throw new Error(`no user ${email}`);
  return row.id;
}
