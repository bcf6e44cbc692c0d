import { afterAll, vi } from 'vitest';
import { closeDb } from '@/db/connection';
import { actingUserId } from './acting-user';

// These tests write. Without an explicit DATABASE_URL the app's default is the demo database,
// so refuse to start rather than leave test rows in it.
if (!process.env.DATABASE_URL || /\/loadproof$/.test(process.env.DATABASE_URL)) {
  throw new Error('Integration tests write: set DATABASE_URL to a scratch database (npm test does this), never the demo database.');
}

// Route handlers and server actions read the signed-in user through this one module;
// integration tests act as a chosen user by replacing it.
vi.mock('@/lib/auth/session-id', () => ({ sessionUserId: async () => actingUserId() }));

// next/cache needs a Next.js request; in these tests revalidation is a no-op.
vi.mock('next/cache', () => ({ revalidatePath: () => {}, revalidateTag: () => {}, unstable_noStore: () => {} }));

// React's cache() memoises per request inside Next.js; outside it, call straight through.
vi.mock('react', async (orig) => ({ ...(await orig<typeof import('react')>()), cache: <T,>(fn: T) => fn }));

afterAll(async () => {
  await closeDb();
});
