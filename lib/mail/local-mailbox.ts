import 'server-only';
import { env } from '@/lib/env';

export type CaughtMail = { id: number; messageId: string | null; from: string; to: string[]; subject: string; text: string; receivedAt: string };

/** Reads the local mail catcher (local mode only); null when there is none to read. */
export async function readLocalMailbox(): Promise<CaughtMail[] | null> {
  const url = env().LOCAL_MAILBOX_URL;
  if (!env().LOADPROOF_LOCAL || !url) return null;
  try {
    const res = await fetch(`${url}/messages`, { cache: 'no-store' });
    if (!res.ok) return null;
    return (await res.json()) as CaughtMail[];
  } catch {
    return null;
  }
}
