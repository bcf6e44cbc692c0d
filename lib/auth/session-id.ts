import 'server-only';
import { getServerSession } from 'next-auth';
import { authOptions } from '@/lib/auth/options';

// The one seam between next-auth and the app: integration tests replace this module to
// act as a given user.
export async function sessionUserId(): Promise<string | null> {
  const session = await getServerSession(authOptions);
  return session?.user?.id ?? null;
}
