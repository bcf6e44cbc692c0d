import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { demoUsers, DEMO_PASSWORD } from '@/db/seeds/demo-people';
import { DISABLED_ACCOUNT, verifyCredentials, WRONG_CREDENTIALS } from '@/lib/auth/credentials';
import { MAX_FAILURES } from '@/lib/auth/throttle';

describe('sign-in', () => {
  it.each(demoUsers.map((u) => [u.role, u.email] as const))('demo %s %s signs in', async (role, email) => {
    const r = await verifyCredentials(email, DEMO_PASSWORD);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.user.role).toBe(role);
      expect(r.user.email).toBe(email);
      expect(JSON.stringify(r.user)).not.toMatch(/\$2[aby]\$/); // no hash in what leaves
      expect(r.user).not.toHaveProperty('passwordHash');
    }
  });

  it('accepts the e-mail in any case and with spaces around it', async () => {
    expect((await verifyCredentials('  Sam.Okafor@LanternHill.test ', DEMO_PASSWORD)).ok).toBe(true);
  });

  it('refuses a wrong password and an unknown e-mail with the same message', async () => {
    const wrong = await verifyCredentials('lena.hartmann@kettenblatt.test', 'not-the-password');
    const unknown = await verifyCredentials('nobody@kettenblatt.test', DEMO_PASSWORD);
    expect(wrong).toEqual({ ok: false, message: WRONG_CREDENTIALS });
    expect(unknown).toEqual({ ok: false, message: WRONG_CREDENTIALS });
  });

  it('locks an e-mail after repeated failures, even with the right password, and says for how long', async () => {
    const email = 'theo.marsh@tidewheel.test';
    await db()('signin_throttle').where({ email }).delete();
    for (let i = 0; i < MAX_FAILURES - 1; i++) {
      expect(await verifyCredentials(email, `wrong-${i}`)).toEqual({ ok: false, message: WRONG_CREDENTIALS });
    }
    const last = await verifyCredentials(email, 'wrong-last');
    expect(last.ok).toBe(false);
    if (!last.ok) expect(last.message).toMatch(/locked for 15 more minutes/);
    const right = await verifyCredentials(email, DEMO_PASSWORD);
    expect(right.ok).toBe(false);
    if (!right.ok) expect(right.message).toMatch(/Too many failed sign-ins/);
    // The lock lifts when its time is up.
    const later = new Date(Date.now() + 16 * 60_000);
    expect((await verifyCredentials(email, DEMO_PASSWORD, later)).ok).toBe(true);
    expect(await db()('signin_throttle').where({ email }).first()).toBeUndefined();
  });

  it('guesses sent in parallel each count: the lock still engages', async () => {
    const email = 'jonas.weber@kettenblatt.test';
    await db()('signin_throttle').where({ email }).delete();
    const results = await Promise.all(Array.from({ length: MAX_FAILURES + 3 }, (_, i) => verifyCredentials(email, `parallel-wrong-${i}`)));
    expect(results.every((r) => !r.ok)).toBe(true);
    const row = await db()('signin_throttle').where({ email }).first();
    expect(row.locked_until).not.toBeNull();
    const right = await verifyCredentials(email, DEMO_PASSWORD);
    expect(right.ok).toBe(false);
    await db()('signin_throttle').where({ email }).delete();
  });

  it('refuses a disabled account with its own message', async () => {
    const email = 'maya.lindqvist@tidewheel.test';
    await db()('users').where({ email }).update({ disabled_at: db().fn.now() });
    try {
      expect(await verifyCredentials(email, DEMO_PASSWORD)).toEqual({ ok: false, message: DISABLED_ACCOUNT });
    } finally {
      await db()('users').where({ email }).update({ disabled_at: null });
    }
  });

  it('the database refuses a role that does not fit the organisation', async () => {
    const shop = await db()('organisations').where({ slug: 'kettenblatt' }).first('id');
    await expect(
      db()('users').insert({ organisation_id: shop.id, org_kind: 'dealer', email: 'crate@kettenblatt.test', name: 'Crate', role: 'warehouse' }),
    ).rejects.toThrow(/users_role_fits_org/);
    // Claiming the brand kind for a dealer shop breaks the composite foreign key instead.
    await expect(
      db()('users').insert({ organisation_id: shop.id, org_kind: 'brand', email: 'crate@kettenblatt.test', name: 'Crate', role: 'warehouse' }),
    ).rejects.toThrow(/foreign key/);
    expect(await db()('users').where({ email: 'crate@kettenblatt.test' }).first()).toBeUndefined();
  });

  it('e-mails are unique whatever their case', async () => {
    const shop = await db()('organisations').where({ slug: 'kettenblatt' }).first('id');
    await expect(
      db()('users').insert({ organisation_id: shop.id, org_kind: 'dealer', email: 'LENA.HARTMANN@kettenblatt.test', name: 'Twin', role: 'dealer' }),
    ).rejects.toThrow(/users_email_lower_unique/);
  });
});
