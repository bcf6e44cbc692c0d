import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dynoCsv, labelPhoto } from '../support/evidence-files';
import { launch, newPage, screenshot, signIn } from './support/browser';

let browser: Browser;
let dir: string;
beforeAll(async () => {
  browser = await launch();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lp-evidence-'));
  fs.writeFileSync(path.join(dir, 'serial-label.jpg'), await labelPhoto('SN DU85-2503-11872'));
  fs.writeFileSync(path.join(dir, 'drive-unit-on-bench.jpg'), await labelPhoto('TV-DU85 removed', { format: 'jpeg' }));
  fs.writeFileSync(path.join(dir, 'dyno-before.csv'), dynoCsv({ peakW: 210 }));
  fs.writeFileSync(path.join(dir, 'not-a-photo.jpg'), Buffer.from('%PDF-1.4\n% a pdf pretending to be a photo\n'));
});
afterAll(async () => {
  await browser?.close();
});

describe('a dealer files a complete claim', () => {
  it('from the frame serial to submission, with photos and a load-test CSV, and sees it in the table and timeline', async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, 'lena.hartmann@kettenblatt.test');
    await page.goto('/claims/new');
    await page.getByLabel('Brand the claim goes to').selectOption({ label: 'Torvane Drive Systems (account TV-DE-0791)' });
    await page.getByLabel('Frame serial').fill('KT25-004187');
    await page.getByTestId('registry-result').getByText('Registered: Kestrel Trek 625').waitFor();
    await page.getByLabel('Failed part').selectOption({ label: 'TV-DU85 — Drive unit DU85 (mid motor)' });
    expect(await page.getByLabel('Part serial').inputValue()).toBe('DU85-2503-11872');
    await page.getByLabel('Failure date').fill('2026-11-20');
    await page.getByLabel('Odometer (km)').fill('2140');
    await page.getByLabel('What the rider noticed').fill('Assist cuts out under load on climbs');
    await page.getByLabel('Error codes').fill('E-042');
    await page.getByLabel('Your diagnosis').fill('Dyno run shows wheel power collapsing above 15 km/h; connectors and firmware checked.');
    await page.getByLabel('Name').first().fill('Mara Kessler');
    await screenshot(page, 'filing-form');
    await page.getByRole('button', { name: 'Save draft and add evidence' }).click();
    await page.waitForURL(/\/claims\/[0-9a-f-]{36}$/);
    const number = await page.getByTestId('claim-number').textContent();
    expect(number).toMatch(/^WC-\d{4}-\d{6}-\d$/);

    const missing = page.getByTestId('missing-list');
    await missing.getByText('A photo of the serial label', { exact: false }).waitFor();
    expect(await page.getByRole('button', { name: 'Submit to the brand' }).isDisabled()).toBe(true);

    // A file whose name lies about its content is refused, and nothing is recorded.
    await page.getByTestId('dropzone-photo').locator('input[type=file]').setInputFiles(path.join(dir, 'not-a-photo.jpg'));
    await page.getByTestId('upload-item').filter({ hasText: 'not-a-photo.jpg' }).getByRole('alert').waitFor();
    expect(await page.getByTestId('upload-item').filter({ hasText: 'not-a-photo.jpg' }).textContent()).toMatch(/PDF document/);

    await page.getByTestId('dropzone-serial_label_photo').locator('input[type=file]').setInputFiles(path.join(dir, 'serial-label.jpg'));
    await page.getByTestId('dropzone-photo').locator('input[type=file]').setInputFiles(path.join(dir, 'drive-unit-on-bench.jpg'));
    await page.getByTestId('dropzone-load_test_before').locator('input[type=file]').setInputFiles(path.join(dir, 'dyno-before.csv'));
    await expect.poll(() => page.getByTestId('evidence-photo').count(), { timeout: 20_000 }).toBe(2);
    await page.getByTestId('evidence-document').filter({ hasText: 'dyno-before.csv' }).waitFor();
    await page.getByText('Ready to submit').waitFor();
    // Thumbnails are real images served through the claim's own short-lived links.
    await expect.poll(() => page.locator('[data-testid=evidence-photo] img').evaluateAll((imgs) => imgs.every((i) => (i as HTMLImageElement).naturalWidth > 0))).toBe(true);
    await screenshot(page, 'filing-evidence');

    await page.getByRole('button', { name: 'Submit to the brand' }).click();
    await page.getByText('Submitted', { exact: true }).first().waitFor();
    await page.getByTestId('timeline').getByText('Submitted to the brand').waitFor();
    await screenshot(page, 'filing-submitted');

    await page.goto('/claims');
    await page.getByTestId('claims-table').getByText(number!).waitFor();
    await screenshot(page, 'filing-table');
    await context.close();
  });
});
