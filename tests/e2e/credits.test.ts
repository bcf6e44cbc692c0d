import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, newPage, screenshot, signIn } from './support/browser';

let browser: Browser;
let dir: string;
beforeAll(async () => {
  browser = await launch();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lp-statements-'));
});
afterAll(async () => {
  await browser?.close();
});

const ddmmyyyy = (d: Date) => `${String(d.getUTCDate()).padStart(2, '0')}.${String(d.getUTCMonth() + 1).padStart(2, '0')}.${d.getUTCFullYear()}`;

describe('from a verified claim to a reconciled credit', () => {
  it('the accountant adjusts and issues a memo, imports the dealer’s statement, confirms the match; the claim is reconciled and the shop sees the memo', async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, 'hana.sato@torvane.test');
    await page.goto('/accounts');
    const queue = page.getByTestId('credit-queue');
    await page.getByLabel('Search the credits queue').fill('Kettenblatt');
    await expect.poll(async () => (await queue.locator('tbody tr').allTextContents()).every((t) => t.includes('Kettenblatt Radwerk'))).toBe(true);
    // A Kettenblatt drive-unit claim whose replacement passed its after-test and whose core was inspected.
    const row = queue.locator('tbody tr').filter({ hasText: 'TV-DU85' }).filter({ hasText: 'After-test passed' }).filter({ hasText: 'Fault confirmed' }).first();
    await row.waitFor();
    await screenshot(page, 'credits-queue');
    await row.getByRole('link').first().click();
    await page.waitForURL(/\/accounts\/claims\/[0-9a-f-]{36}$/);
    const claimNumber = (await page.getByTestId('claim-number').textContent())!.trim();
    const draft = page.getByTestId('credit-draft');
    await draft.getByText('Labor at the dealer’s agreed rate', { exact: false }).waitFor();
    await screenshot(page, 'credit-draft');

    // Adjust the freight line, with a reason; the draft shows the edit against the computed value.
    const freight = draft.locator('tr', { hasText: 'Freight allowance' });
    await freight.getByText('Adjust this line').click();
    await freight.getByLabel('Posts instead').fill('15.00');
    await freight.getByLabel('Why (the dealer sees this)').fill('Freight invoice attached to the claim shows 15.00');
    await freight.getByRole('button', { name: 'Save the change' }).click();
    await freight.getByText('changed', { exact: false }).waitFor();
    await expect.poll(() => draft.locator('tr', { hasText: 'Freight allowance' }).getByText('Adjusted').count()).toBe(1);
    const amount = (await draft.getByTestId('lines-total').getAttribute('data-amount'))!;
    expect(amount).toMatch(/^\d+\.\d{2}$/);

    await page.getByTestId('issue-credit').click();
    const issued = page.getByText(/^Memo CM-\d{4}-\d{6}-\d issued$/);
    await issued.waitFor();
    const memoNumber = (await issued.textContent())!.match(/CM-\d{4}-\d{6}-\d/)![0];
    await page.getByTestId('memo-document').getByTestId('memo-number').filter({ hasText: memoNumber }).waitFor();
    await screenshot(page, 'credit-issued');

    // A statement with a bad row is refused whole, with the row named.
    const today = ddmmyyyy(new Date());
    fs.writeFileSync(path.join(dir, 'kettenblatt-bad.csv'), `Datum;Buchungstext;Betrag\n${today};Gutschrift ${memoNumber};${amount.replace('.', ',')}\n31.02.2026;Rest;1,00\n`);
    fs.writeFileSync(path.join(dir, 'kettenblatt-dezember.csv'), `Datum;Buchungstext;Betrag\n${today};Gutschrift ${memoNumber};${amount.replace('.', ',')}\n`);
    await page.goto('/accounts/statements/new');
    await page.getByLabel('Source').fill('Kettenblatt Radwerk — monthly statement');
    await page.getByLabel('Statement file').setInputFiles(path.join(dir, 'kettenblatt-bad.csv'));
    await page.getByTestId('statement-preview').waitFor();
    // The German headers are recognised; the format is stated, never guessed.
    expect(await page.getByLabel('Date column').inputValue()).toBe('Datum');
    expect(await page.getByLabel('Reference (memo, claim or RMA number) column').inputValue()).toBe('Buchungstext');
    expect(await page.getByLabel('Amount (signed) column').inputValue()).toBe('Betrag');
    await page.getByLabel('Date format').selectOption('DD.MM.YYYY');
    await page.getByLabel('Decimal separator').selectOption(',');
    expect(await page.getByLabel('Dealer', { exact: true }).locator('option:checked').textContent()).toContain('Kettenblatt Radwerk');
    await page.getByRole('button', { name: 'Import the statement' }).click();
    const errors = page.getByTestId('row-errors');
    await errors.getByText('nothing was imported').waitFor();
    expect(await errors.locator('tbody tr').first().textContent()).toMatch(/^3Datum.*31\.02\.2026/);
    await screenshot(page, 'statement-row-errors');

    await page.getByLabel('Statement file').setInputFiles(path.join(dir, 'kettenblatt-dezember.csv'));
    await page.getByRole('button', { name: 'Import the statement' }).click();
    await page.waitForURL(/\/accounts\/statements\/[0-9a-f-]{36}/);
    const line = page.getByTestId('statement-line-2');
    await line.getByRole('link', { name: memoNumber }).waitFor();
    await line.getByText('by reference').waitFor();
    await screenshot(page, 'statement-proposed');
    await line.getByRole('button', { name: `Confirm the match with ${memoNumber}` }).click();
    await line.getByText('Matched by Hana Sato').waitFor();
    await screenshot(page, 'statement-confirmed');

    await line.getByRole('link', { name: memoNumber }).click();
    await page.waitForURL(/\/accounts\/claims\//);
    await page.getByTestId('claim-number').click();
    await page.waitForURL(/\/claims\/[0-9a-f-]{36}$/);
    await page.getByText('Reconciled', { exact: true }).first().waitFor();
    await page.getByTestId('timeline').getByText("Reconciled with the dealer's statement").waitFor();
    await page.getByTestId('claim-credit').getByText(memoNumber).waitFor();
    await screenshot(page, 'claim-reconciled');
    await context.close();

    // The shop admin sees the memo, adjusted line and all, and can download it.
    const shop = await newPage(browser);
    await signIn(shop.page, 'jonas.weber@kettenblatt.test');
    await shop.page.goto('/credits');
    const torvane = shop.page.getByTestId('credits-Torvane Drive Systems');
    await torvane.getByText(memoNumber).waitFor();
    expect(await torvane.locator('tr', { hasText: memoNumber }).textContent()).toContain('On your statement');
    await screenshot(shop.page, 'dealer-credits');
    const download = await shop.page.request.get(await torvane.getByRole('link', { name: 'Download CSV for your books' }).getAttribute('href') as string);
    expect(download.headers()['content-type']).toMatch(/text\/csv/);
    expect(await download.text()).toContain(`LP-MEMO-LINES-1,${memoNumber},claim`);
    await torvane.getByRole('link', { name: memoNumber }).first().click();
    await shop.page.getByTestId('memo-document').getByText('Freight invoice attached to the claim shows 15.00', { exact: false }).waitFor();
    await screenshot(shop.page, 'dealer-memo');
    await shop.context.close();
  });
});
