import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '@/db/seeds/demo-people';
import { HOME_PATH } from '@/lib/auth/roles';
import { launch, newPage, screenshot, signIn, waitForMail } from './support/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe('signing in and the shell', () => {
  // One user per role is enough here; the integration suite signs in every demo user.
  const onePerRole = [...new Map(demoUsers.map((u) => [u.role, u])).values()];

  it.each(onePerRole.map((u) => [u.role, u.email] as const))('%s lands on its own home page', async (role, email) => {
    const { context, page } = await newPage(browser);
    await signIn(page, email);
    await page.waitForURL((u) => u.pathname === HOME_PATH[role]);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBeTruthy();
    await screenshot(page, `home-${role}`);
    await context.close();
  });

  it('a wrong password shows a clear message and stays on sign-in', async () => {
    const { context, page } = await newPage(browser);
    await page.goto('/signin');
    await page.getByLabel('E-mail').fill('noah.quinn@wrenfield.test');
    await page.getByLabel('Password').fill('definitely-wrong');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('alert').filter({ hasText: 'That e-mail and password do not match an account' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/signin');
    await context.close();
  });

  it('a signed-out visit to a private page goes to sign-in and back after it', async () => {
    const { context, page } = await newPage(browser);
    await page.goto('/people');
    await page.waitForURL(/\/signin\?next=%2Fpeople/);
    await page.getByLabel('E-mail').fill('noah.quinn@wrenfield.test');
    await page.getByLabel('Password').fill('loadproof-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/people');
    await context.close();
  });

  it('signing out ends the session', async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, 'ada.kowalski@wrenfield.test');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/signin/);
    await page.goto('/accounts');
    await page.waitForURL(/\/signin/);
    await context.close();
  });

  it('the unit switch persists across pages and sessions', async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, 'tom.reyes@wrenfield.test');
    const metric = page.getByRole('button', { name: 'km/h · N·m' });
    const saved = () => page.waitForResponse((r) => r.request().method() === 'POST' && r.status() === 200);
    await Promise.all([saved(), metric.click()]);
    await expect.poll(() => metric.getAttribute('aria-pressed')).toBe('true');
    await page.reload();
    expect(await page.getByRole('button', { name: 'km/h · N·m' }).getAttribute('aria-pressed')).toBe('true');
    await Promise.all([saved(), page.getByRole('button', { name: 'mph · lbf·ft' }).click()]);
    await expect.poll(() => page.getByRole('button', { name: 'mph · lbf·ft' }).getAttribute('aria-pressed')).toBe('true');
    await page.reload();
    expect(await page.getByRole('button', { name: 'mph · lbf·ft' }).getAttribute('aria-pressed')).toBe('true');
    await context.close();
  });
});

describe('inviting a colleague', () => {
  it('an admin invites, the mail arrives in the local mailbox, the link sets a password, the new user signs in', async () => {
    const email = `kai.brenner.${Date.now()}@kettenblatt.test`;
    const admin = await newPage(browser);
    await signIn(admin.page, 'jonas.weber@kettenblatt.test');
    await admin.page.goto('/people');
    await admin.page.getByLabel('Name').fill('Kai Brenner');
    await admin.page.getByLabel('E-mail').fill(email);
    await admin.page.getByLabel('Role').selectOption('dealer');
    await admin.page.getByRole('button', { name: 'Send invitation' }).click();
    await admin.page.getByText(`Invitation sent to ${email}.`).waitFor();
    await screenshot(admin.page, 'people-invited');

    const mail = await waitForMail(email, (m) => m.subject.includes('Kettenblatt Radwerk'));
    const link = mail.text.match(/https?:\/\/\S+\/invite\/[A-Za-z0-9_-]+/)?.[0];
    expect(link).toBeTruthy();

    // The admin sees the same mail on the local Mailbox page.
    await admin.page.goto('/mailbox');
    await admin.page.getByTestId('caught-mail').filter({ hasText: email }).first().waitFor();
    await admin.context.close();

    const invitee = await newPage(browser);
    await invitee.page.goto(new URL(link!).pathname);
    await invitee.page.getByRole('heading', { name: 'Welcome, Kai Brenner' }).waitFor();
    await invitee.page.getByLabel('Password', { exact: true }).fill('chainring-2026');
    await invitee.page.getByLabel('Password again').fill('chainring-2026');
    await invitee.page.getByRole('button', { name: 'Save password' }).click();
    await invitee.page.getByText('Your password is saved').waitFor();
    await invitee.page.getByLabel('Password').fill('chainring-2026');
    await invitee.page.getByRole('button', { name: 'Sign in' }).click();
    await invitee.page.getByTestId('signed-in-as').filter({ hasText: 'Kai Brenner' }).waitFor();
    expect(new URL(invitee.page.url()).pathname).toBe('/claims');

    // The link is spent.
    await invitee.page.goto(new URL(link!).pathname);
    await invitee.page.getByText('This invitation has been used already.').waitFor();
    await invitee.context.close();
  });
});
