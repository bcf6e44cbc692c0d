import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, newPage, screenshot, signIn } from './support/browser';

let browser: Browser;
let dir: string;
const tag = Date.now().toString(36).toUpperCase();
beforeAll(async () => {
  browser = await launch();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lp-registry-'));
});
afterAll(async () => {
  await browser?.close();
});

describe('a brand admin keeps the catalog', () => {
  it('adds a drive unit with its dyno spec, edits warranty terms, and imports a registry file with one bad row', async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, 'diego.alves@torvane.test');
    await page.goto('/catalog');
    const tabs = page.getByRole('navigation', { name: 'Catalog sections' });
    await tabs.waitFor();
    await screenshot(page, 'catalog-overview');

    // A part: first without a spec (refused, and what was typed stays), then with it.
    const partNumber = `TV-DU90-${tag}`;
    await tabs.getByRole('link', { name: 'Parts & specs' }).click();
    await page.getByLabel('Part number').fill(partNumber);
    await page.getByLabel('Name').fill('Drive unit DU90 (browser test)');
    await page.getByLabel('Kind of part').selectOption('drive_unit');
    await page.getByRole('button', { name: 'Add part' }).click();
    await page.getByText('A drive unit needs a minimum wheel power or torque', { exact: false }).waitFor();
    expect(await page.getByLabel('Part number').inputValue()).toBe(partNumber);
    await page.getByLabel('Minimum wheel power', { exact: true }).fill('320');
    await page.getByLabel('Minimum wheel torque', { exact: true }).fill('26');
    await page.getByLabel('Unit cost (EUR)').fill('455.00');
    await page.getByRole('button', { name: 'Add part' }).click();
    await page.getByText(`${partNumber} added.`).waitFor();
    const row = page.getByTestId(`part-${partNumber}`);
    await row.getByText('≥ 320 W at the wheel').waitFor();
    await row.getByText('≥ 26.0 N·m at the wheel').waitFor();
    await screenshot(page, 'catalog-parts');

    // The same spec read by an admin who works in imperial units (NIST SP 811: 1 hp = 745.699 872 W, 1 lbf·ft = 1.355 818 N·m).
    await page.getByRole('button', { name: /mph/ }).click();
    await row.getByText('≥ 0.43 hp at the wheel').waitFor();
    await row.getByText('≥ 19.2 lbf·ft at the wheel').waitFor();
    await page.getByRole('button', { name: /km\/h/ }).click();
    await row.getByText('≥ 320 W at the wheel').waitFor();

    // Warranty terms for chargers: 18 months and one more exclusion; then back as they were.
    await tabs.getByRole('link', { name: 'Warranty terms' }).click();
    await page.getByRole('link', { name: 'Edit terms for Charger' }).click();
    const terms = page.getByRole('form', { name: 'Warranty terms for Charger' });
    const before = await terms.getByLabel('Months covered from retail sale').inputValue();
    await terms.getByLabel('Months covered from retail sale').fill('18');
    await terms.getByLabel('Charging with a charger not approved for the battery').check();
    await terms.getByRole('button', { name: 'Save terms' }).click();
    await page.getByText('Warranty terms saved.', { exact: false }).waitFor();
    await page.getByTestId('policy-charger').getByText('18 months from sale').waitFor();
    await page.getByTestId('policy-charger').getByText('Not covered: charging with a charger not approved for the battery').waitFor();
    await screenshot(page, 'catalog-policies');
    await terms.getByLabel('Months covered from retail sale').fill(before);
    await terms.getByLabel('Charging with a charger not approved for the battery').uncheck();
    await terms.getByRole('button', { name: 'Save terms' }).click();
    await page.getByTestId('policy-charger').getByText(`${before} months from sale`).waitFor();

    // A registry file: three good rows and one with a model code the catalog does not have.
    const file = path.join(dir, `sold-${tag}.csv`);
    fs.writeFileSync(
      file,
      [
        'frame_serial,model_code,retail_sale_date,selling_dealer_account,component_serials',
        `E2E${tag}-1,KST-T,2026-02-10,TV-DE-0791,drive_unit=DU85-${tag}-1;battery=BP625-${tag}-1`,
        `E2E${tag}-2,KST-U,2026-02-11,TV-US-0418,drive_unit=DU60-${tag}-2`,
        `E2E${tag}-3,NOPE-1,2026-02-12,,`,
        `E2E${tag}-4,HRR-C,2026-02-13,,`,
      ].join('\n'),
    );
    await tabs.getByRole('link', { name: 'Registry' }).click();
    await page.getByRole('link', { name: 'Import from CSV' }).click();
    await page.getByTestId('registry-dropzone').locator('input[type=file]').setInputFiles(file);
    await page.getByTestId('registry-preview').waitFor();
    expect(await page.getByTestId('ready-count').textContent()).toBe('3 ready');
    expect(await page.getByTestId('refused-count').textContent()).toBe('1 refused');
    await page.getByTestId('preview-row-4').getByText('“NOPE-1” is not a model code in the catalog.').waitFor();
    await screenshot(page, 'catalog-registry-preview');
    await page.getByRole('button', { name: 'Import 3 ready rows' }).click();
    await page.getByText('3 bikes registered; 1 row left out.').waitFor();

    await page.getByRole('link', { name: 'See the registry' }).click();
    await page.getByLabel('Search the registry').fill(`E2E${tag}`);
    await page.getByRole('button', { name: 'Search' }).click();
    await page.getByText('3 bikes matching', { exact: false }).waitFor();
    await page.getByTestId(`unit-E2E${tag}-1`).getByText(`battery=BP625-${tag}-1; drive_unit=DU85-${tag}-1`).waitFor();
    expect(await page.getByTestId(`unit-E2E${tag}-3`).count()).toBe(0);
    await page.getByTestId('registry-imports').getByText(`sold-${tag}.csv`).first().waitFor();
    await screenshot(page, 'catalog-registry');
    await context.close();
  });

  it('the catalog is not there for a warranty rep or a dealer', async () => {
    for (const email of ['priya.nair@torvane.test', 'lena.hartmann@kettenblatt.test']) {
      const { context, page } = await newPage(browser);
      await signIn(page, email);
      const res = await page.goto('/catalog/parts');
      expect(res?.status()).toBe(404);
      await context.close();
    }
  });
});
