import 'server-only';
import { decode } from 'next-auth/jwt';
import { cookies } from 'next/headers';
import { env } from '@/lib/env';

const SESSION_COOKIES = ['__Secure-next-auth.session-token', 'next-auth.session-token'];

// The one seam between next-auth and the app: integration tests replace this module to
// act as a given user. Decoding the session JWT directly (it checks signature, encryption
// and expiry) skips getServerSession's callback round, which every request would pay.
export async function sessionUserId(): Promise<string | null> {
  const jar = await cookies();
  const token = SESSION_COOKIES.map((name) => jar.get(name)?.value).find(Boolean);
  if (!token) return null;
  try {
    const jwt = await decode({ token, secret: env().AUTH_SECRET });
    return typeof jwt?.uid === 'string' ? jwt.uid : null;
  } catch {
    return null;
  }
}
