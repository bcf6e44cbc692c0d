import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '@/db/connection';
import { approvedClaim } from '../support/approved-claims';
import { launch, newPage, screenshot, signIn } from './support/browser';

// A shop fitted a drive unit from its own shelf and the brand approved the claim: nothing ships,
// the warehouse has nothing to pick, and the dealer proves the repair with the after-test at once.

const DEALER = 'lena.hartmann@kettenblatt.test';
const WAREHOUSE = 'felix.moreau@torvane.test';
const FIXTURES = path.resolve('tests/fixtures/loadtest');

let browser: Browser;
let claim: { id: string; number: string; rmaNumber: string | null };

beforeAll(async () => {
  browser = await launch();
  claim = await approvedClaim({ failedPart: 'TV-DU85', lines: [{ part: 'TV-DU85', fromDealerStock: true }], labor: ['DU-RR', 'LT-BA'] });
});

afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe('a replacement fitted from the shop’s own stock', () => {
  it('the warehouse sees nothing to ship; the dealer uploads the after-test and the repair is verified', async () => {
    const wh = await newPage(browser);
    await signIn(wh.page, WAREHOUSE);
    await wh.page.goto(`/warehouse/claims/${claim.id}`);
    await wh.page.getByText('Nothing to ship: the dealer fitted every approved part from its own stock. Only the core comes back.').waitFor();
    expect(await wh.page.getByTestId('ship-section').count()).toBe(0);
    expect(await wh.page.getByTestId('packing-slip-link').count()).toBe(0);
    await wh.context.close();

    const { context, page } = await newPage(browser);
    await signIn(page, DEALER);
    await page.goto(`/claims/${claim.id}`);
    await page.getByText('From the shop’s own stock: nothing ships').waitFor();
    await page.getByText('Nothing ships: prove the repair').waitFor();

    const panel = page.getByTestId('load-test-panel');
    const after = panel.getByTestId('load-test-upload-after');
    // The bike is not in the registry, so the dealer enters the tyre the run was made on.
    await after.getByLabel('Tyre size').fill('57-622');
    await after.getByTestId('dropzone-load_test_after').locator('input[type=file]').setInputFiles(path.join(FIXTURES, 'dyno-mid-drive-metric.csv'));
    await panel.locator('[data-testid=load-test-run][data-phase=after]').getByText('Meets the part’s spec').waitFor();
    await screenshot(page, 'shop-stock-after-test');
    await panel.getByRole('button', { name: 'Mark fitted with this after-test' }).click();
    await expect.poll(async () => (await db()('claims').where({ id: claim.id }).first('replacement_step')).replacement_step).toBe('verified');
    await page.reload();
    await page.getByTestId('timeline').getByText('Replacement fitted').waitFor();
    // The core still goes back, on its clock from the approval.
    expect((await db()('claims').where({ id: claim.id }).first('core_step')).core_step).toBe('requested');
    await context.close();
  });
});
