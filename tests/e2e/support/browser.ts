import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const APP_URL = process.env.APP_URL ?? 'http://127.0.0.1:3100';
export const MAILBOX_URL = process.env.LOCAL_MAILBOX_URL ?? 'http://127.0.0.1:2590';
export const DEMO_PASSWORD = 'loadproof-demo';
const shotDir = path.resolve('tests/e2e/screenshots');

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--no-first-run',
    ],
  });
}

export async function newPage(browser: Browser): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ baseURL: APP_URL, viewport: { width: 1360, height: 900 } });
  const page = await context.newPage();
  page.setDefaultTimeout(20_000);
  return { context, page };
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/signin');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-as').waitFor();
}

export async function screenshot(page: Page, name: string): Promise<void> {
  fs.mkdirSync(shotDir, { recursive: true });
  await page.screenshot({ path: path.join(shotDir, `${name}.png`), fullPage: true });
}

export type CaughtMail = { id: number; messageId: string | null; to: string[]; subject: string; text: string };

export async function mailFor(address: string): Promise<CaughtMail[]> {
  const res = await fetch(`${MAILBOX_URL}/messages?to=${encodeURIComponent(address)}`);
  return (await res.json()) as CaughtMail[];
}

export async function waitForMail(address: string, match: (m: CaughtMail) => boolean, timeoutMs = 20_000): Promise<CaughtMail> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const found = (await mailFor(address)).find(match);
    if (found) return found;
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`no mail for ${address} matched within ${timeoutMs} ms`);
}
