import { createHash } from 'node:crypto';
import { beforeEach, describe, expect, it } from 'vitest';
import { acceptInviteAction } from '@/app/(auth)/invite/actions';
import { inviteAction, setDisabledAction } from '@/app/(app)/people/actions';
import { db } from '@/db/connection';
import { verifyCredentials } from '@/lib/auth/credentials';
import { markSent } from '@/lib/db/outbox';
import { lookupInvitation } from '@/lib/services/people';
import { actAs, userId } from '../../support/acting-user';

const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
};

const counts = async () => ({
  users: Number((await db()('users').count('id as n').first())!.n),
  invitations: Number((await db()('invitations').count('id as n').first())!.n),
  outbox: Number((await db()('outbox').count('id as n').first())!.n),
});

/** The token is only ever in the e-mail; read it back from the queued mail. */
async function tokenFromOutbox(email: string): Promise<string> {
  const row = await db()('outbox').where({ to_email: email }).orderBy('id', 'desc').first('text_body');
  const m = String(row?.text_body).match(/\/invite\/([A-Za-z0-9_-]+)/);
  if (!m) throw new Error('no invitation link in the mail');
  return m[1]!;
}

let n = 0;
const fresh = () => `new.person.${Date.now()}.${n++}@lanternhill.test`;

describe('inviting people', () => {
  beforeEach(() => actAs('rita.vance@lanternhill.test'));

  it('once the invitation is sent, the copy kept in the outbox no longer carries the link', async () => {
    const email = fresh();
    expect(await inviteAction(undefined, form({ name: 'Noor Vale', email, role: 'dealer' }))).toMatchObject({ ok: true });
    const token = await tokenFromOutbox(email);
    const row = await db()('outbox').where({ to_email: email }).orderBy('id', 'desc').first('id');
    await markSent([row.id]);
    const kept = await db()('outbox').where({ id: row.id }).first('status', 'text_body', 'html_body');
    expect(kept.status).toBe('sent');
    expect(`${kept.text_body} ${kept.html_body ?? ''}`).not.toContain(token);
    expect(kept.text_body).toContain('/invite/(link sent by e-mail)');
    // The link itself still works: only the stored copy was cleared.
    expect(await lookupInvitation(token)).toMatchObject({ ok: true, email });
  });

  it('a shop admin invites a colleague; the mail is queued with a one-time link; the new user signs in', async () => {
    const email = fresh();
    const before = await counts();
    const state = await inviteAction(undefined, form({ name: 'Ari Fenn', email, role: 'dealer' }));
    expect(state).toMatchObject({ ok: true });
    const after = await counts();
    expect(after.invitations).toBe(before.invitations + 1);
    expect(after.outbox).toBe(before.outbox + 1);
    const token = await tokenFromOutbox(email);
    // Only the hash is stored.
    const inv = await db()('invitations').where({ email }).first();
    expect(inv.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(inv)).not.toContain(token);

    expect(await lookupInvitation(token)).toMatchObject({ ok: true, email, orgName: 'Lanternhill Cycles', role: 'dealer' });
    await expect(acceptInviteAction(undefined, form({ token, password: 'a-long-password', confirm: 'a-long-password' }))).rejects.toThrow(/NEXT_REDIRECT/);
    const signIn = await verifyCredentials(email, 'a-long-password');
    expect(signIn.ok && signIn.user.role).toBe('dealer');

    // The same link a second time: refused, and no second account.
    const usersNow = (await counts()).users;
    const again = await acceptInviteAction(undefined, form({ token, password: 'another-password', confirm: 'another-password' }));
    expect(again).toMatchObject({ ok: false, message: expect.stringMatching(/used already/) });
    expect((await counts()).users).toBe(usersNow);
    expect(await lookupInvitation(token)).toMatchObject({ ok: false, message: expect.stringMatching(/used already/) });
  });

  it('an expired link is refused and creates nothing', async () => {
    const email = fresh();
    await inviteAction(undefined, form({ name: 'Late Comer', email, role: 'dealer' }));
    const token = await tokenFromOutbox(email);
    await db()('invitations').where({ email }).update({ expires_at: db().raw(`now() - interval '1 minute'`) });
    const before = await counts();
    const r = await acceptInviteAction(undefined, form({ token, password: 'a-long-password', confirm: 'a-long-password' }));
    expect(r).toMatchObject({ ok: false, message: expect.stringMatching(/expired/) });
    expect(await counts()).toEqual(before);
  });

  it('an unknown link, a short password and mismatched passwords are refused', async () => {
    expect(await lookupInvitation('x'.repeat(43))).toMatchObject({ ok: false, message: expect.stringMatching(/not valid/) });
    const before = await counts();
    const short = await acceptInviteAction(undefined, form({ token: 'y'.repeat(43), password: 'short', confirm: 'short' }));
    expect(short?.fieldErrors?.password?.[0]).toMatch(/at least 10/);
    const differ = await acceptInviteAction(undefined, form({ token: 'y'.repeat(43), password: 'a-long-password', confirm: 'b-long-password' }));
    expect(differ?.fieldErrors?.confirm?.[0]).toMatch(/differ/);
    const unknown = await acceptInviteAction(undefined, form({ token: 'y'.repeat(43), password: 'a-long-password', confirm: 'a-long-password' }));
    expect(unknown).toMatchObject({ ok: false, message: expect.stringMatching(/not valid/) });
    expect(await counts()).toEqual(before);
  });

  it('an invite with a role that does not fit the shop is refused on the role field, nothing written', async () => {
    const before = await counts();
    const r = await inviteAction(undefined, form({ name: 'Wrong Fit', email: fresh(), role: 'warehouse' }));
    expect(r).toMatchObject({ ok: false });
    expect(r?.fieldErrors?.role?.[0]).toMatch(/Service desk, Shop admin/);
    expect(await counts()).toEqual(before);
  });

  it('an e-mail that already has an account is refused', async () => {
    const before = await counts();
    const r = await inviteAction(undefined, form({ name: 'Sam Again', email: 'SAM.OKAFOR@lanternhill.test', role: 'dealer' }));
    expect(r?.fieldErrors?.email?.[0]).toMatch(/already has an account/);
    expect(await counts()).toEqual(before);
  });

  it('a non-admin cannot invite (the page and the action both answer not-found)', async () => {
    await actAs('sam.okafor@lanternhill.test');
    const before = await counts();
    await expect(inviteAction(undefined, form({ name: 'Sneaky', email: fresh(), role: 'dealer_admin' }))).rejects.toThrow(/NEXT_HTTP_ERROR_FALLBACK;404|NEXT_NOT_FOUND/);
    expect(await counts()).toEqual(before);
  });

  it('a signed-out caller is sent to sign-in', async () => {
    await actAs(null);
    await expect(inviteAction(undefined, form({ name: 'Ghost', email: fresh(), role: 'dealer' }))).rejects.toThrow(/NEXT_REDIRECT/);
  });
});

describe('switching accounts off', () => {
  it('an admin switches a colleague off; they cannot sign in; switched on again they can', async () => {
    await actAs('jonas.weber@kettenblatt.test');
    const lena = await userId('lena.hartmann@kettenblatt.test');
    expect(await setDisabledAction(undefined, form({ userId: lena, disabled: 'true' }))).toMatchObject({ ok: true });
    expect(await verifyCredentials('lena.hartmann@kettenblatt.test', 'loadproof-demo')).toMatchObject({ ok: false, message: expect.stringMatching(/switched off/) });
    // A session held by the switched-off user stops working at once.
    await actAs('lena.hartmann@kettenblatt.test');
    const { currentUser } = await import('@/lib/auth/session');
    expect(await currentUser()).toBeNull();
    await actAs('jonas.weber@kettenblatt.test');
    expect(await setDisabledAction(undefined, form({ userId: lena, disabled: 'false' }))).toMatchObject({ ok: true });
    expect((await verifyCredentials('lena.hartmann@kettenblatt.test', 'loadproof-demo')).ok).toBe(true);
  });

  it('an admin acting on another organisation’s user gets not-found and changes nothing', async () => {
    await actAs('jonas.weber@kettenblatt.test');
    const sam = await userId('sam.okafor@lanternhill.test');
    const r = await setDisabledAction(undefined, form({ userId: sam, disabled: 'true' }));
    expect(r).toMatchObject({ ok: false, message: 'No such person in your organisation.' });
    expect((await db()('users').where({ id: sam }).first()).disabled_at).toBeNull();
  });

  it('a brand admin cannot reach a dealer’s user either, and an admin cannot switch themself off', async () => {
    await actAs('diego.alves@torvane.test');
    const sam = await userId('sam.okafor@lanternhill.test');
    expect(await setDisabledAction(undefined, form({ userId: sam, disabled: 'true' }))).toMatchObject({ ok: false });
    const diego = await userId('diego.alves@torvane.test');
    expect(await setDisabledAction(undefined, form({ userId: diego, disabled: 'true' }))).toMatchObject({ ok: false, message: /own account/ });
    expect((await db()('users').where({ id: diego }).first()).disabled_at).toBeNull();
  });

  it('a non-admin cannot switch anyone off', async () => {
    await actAs('sam.okafor@lanternhill.test');
    const rita = await userId('rita.vance@lanternhill.test');
    await expect(setDisabledAction(undefined, form({ userId: rita, disabled: 'true' }))).rejects.toThrow(/NEXT_HTTP_ERROR_FALLBACK;404|NEXT_NOT_FOUND/);
    expect((await db()('users').where({ id: rita }).first()).disabled_at).toBeNull();
  });
});

describe('inviting the same person twice', () => {
  it('while the first invitation is open, a second is refused and no second mail goes out', async () => {
    await actAs('rita.vance@lanternhill.test');
    const email = fresh();
    expect(await inviteAction(undefined, form({ name: 'Twice Asked', email, role: 'dealer' }))).toMatchObject({ ok: true });
    const before = await counts();
    const again = await inviteAction(undefined, form({ name: 'Twice Asked', email: email.toUpperCase(), role: 'dealer' }));
    expect(again?.fieldErrors?.email?.[0]).toMatch(/still open/);
    expect(await counts()).toEqual(before);
  });
});
