import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { PDFParse } from 'pdf-parse';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '@/db/connection';
import { approvedClaim, setStock } from '../support/approved-claims';
import { advanceParcel } from '../support/carrier';
import { labelPhoto } from '../support/evidence-files';
import { launch, newPage, screenshot, signIn, waitForMail } from './support/browser';

const WAREHOUSE = 'felix.moreau@torvane.test';
const DEALER = 'theo.marsh@tidewheel.test';

let browser: Browser;
let dir: string;
let claim: { id: string; number: string; rmaNumber: string | null };
let backordered: { id: string; number: string; rmaNumber: string | null };
let recycled: { id: string; number: string; rmaNumber: string | null };

beforeAll(async () => {
  browser = await launch();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lp-fulfil-'));
  fs.writeFileSync(path.join(dir, 'core-on-bench.jpg'), await labelPhoto('BP625 swollen seam'));
  await setStock('torvane', 'TV-BP625', 4);
  claim = await approvedClaim({
    failedPart: 'TV-BP625', dealer: 'tidewheel', filedBy: DEALER, symptom: 'Battery housing bulged after charging',
    description: 'Housing swollen along the seam; isolated outdoors.',
  });
  await setStock('torvane', 'TV-DU85', 0, '2027-02-01');
  backordered = await approvedClaim({ failedPart: 'TV-DU85', dealer: 'tidewheel', filedBy: DEALER });
  recycled = await approvedClaim({ failedPart: 'TV-BP500', dealer: 'tidewheel', filedBy: DEALER });
  fs.writeFileSync(path.join(dir, 'recycler-receipt.jpg'), await labelPhoto('Recycling receipt BP500'));
});

afterAll(async () => {
  await browser?.close();
  await closeDb();
});

async function pdfText(bytes: Buffer): Promise<string> {
  const parser = new PDFParse({ data: bytes });
  const text = (await parser.getText()).text;
  await parser.destroy();
  return text;
}

describe('fulfilment: a damaged battery core, from the warehouse shelf and back', () => {
  it('the warehouse picks and ships the replacement battery and prints the packing slip', async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, WAREHOUSE);
    await page.goto('/warehouse');
    await page.getByLabel('RMA, claim or dealer').fill(claim.rmaNumber!);
    const row = page.getByTestId('to-ship-table').locator(`tr[data-row-id="${claim.id}"]`);
    await row.getByText('Ready to pick').waitFor();
    await row.getByText('Lithium · UN3480').waitFor();
    await screenshot(page, 'fulfilment-queues');
    await row.getByText('Pick & ship →').click();

    const ship = page.getByTestId('ship-section');
    await ship.getByTestId('dangerous-goods').getByText(/UN3480 Lithium ion batteries · Class 9 · 626.4 Wh · fully regulated/).waitFor();
    // A battery alone may not go on passenger aircraft: the next-day air service is shown but not offered.
    await expect.poll(() => ship.getByRole('radio', { name: /Next-day air/ }).isDisabled()).toBe(true);
    await ship.getByText(/cargo aircraft only \(IATA PI 965\)/).waitFor();
    expect(await ship.getByRole('button', { name: 'Ship the replacement' }).isDisabled()).toBe(true);
    await ship.getByLabel('Picked 1 × TV-BP625').check();
    await ship.getByRole('radio', { name: /Ferrule Parcel · Road parcel/ }).check();
    await screenshot(page, 'fulfilment-ship-form');
    await ship.getByRole('button', { name: 'Ship the replacement' }).click();
    await page.getByTestId('parcel-outbound').waitFor();
    await page.getByTestId('replacement-track').locator('[data-step="shipped"][data-state="current"]').waitFor();

    const slip = await context.request.get(`/api/claims/${claim.id}/packing-slip`);
    expect(slip.status()).toBe(200);
    const text = await pdfText(Buffer.from(await slip.body()));
    expect(text).toContain(claim.rmaNumber!);
    expect(text).toContain('Tidewheel Cycles');
    expect(text).toContain('55 Quayside Lane');
    expect(text).toMatch(/UN3480 Lithium ion batteries, Class 9, 626\.4 Wh/);
    await screenshot(page, 'fulfilment-shipped');
    await context.close();
  });

  it('the warehouse issues a ground-only return label once the special packaging is confirmed', async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, WAREHOUSE);
    await page.goto(`/warehouse/claims/${claim.id}`);
    const form = page.getByTestId('return-label-form');
    await form.getByRole('radio', { name: /Damaged or defective/ }).check();
    await form.getByTestId('dg-packaging').getByText(/non-metallic inner packaging/).waitFor();
    await form.getByTestId('dg-marks').getByText('"DAMAGED/DEFECTIVE LITHIUM ION BATTERIES"').waitFor();
    // No air for a damaged battery (IATA SP A154): both air services are greyed out with the reason.
    expect(await form.getByRole('radio', { name: /Air freighter/ }).isDisabled()).toBe(true);
    expect(await form.getByText(/may not travel by air \(IATA special provision A154\)/).count()).toBeGreaterThan(0);
    await form.getByRole('radio', { name: /Skeinway Express · Ground freight/ }).check();
    // The label waits for the packaging confirmation.
    expect(await form.getByRole('button', { name: 'Issue the return label' }).isDisabled()).toBe(true);
    await form.getByRole('checkbox').check();
    await screenshot(page, 'fulfilment-return-label-form');
    await form.getByRole('button', { name: 'Issue the return label' }).click();
    await page.getByTestId('label-section').getByText(/Issued: /).waitFor();
    await context.close();
  });

  it('the dealer sees the battery delivered, prints the return label and ships the core packed as instructed', async () => {
    const parcel = await db()('shipments').where({ claim_id: claim.id, direction: 'outbound' }).whereNull('voided_at').first('tracking_number');
    await advanceParcel(parcel.tracking_number, 'delivered');

    const { context, page } = await newPage(browser);
    await signIn(page, DEALER);
    await page.goto(`/claims/${claim.id}`);
    // The worker polls the carrier; the claim page shows the delivery once it has.
    await expect
      .poll(async () => {
        await page.reload();
        return page.getByTestId('replacement-track').locator('[data-step="delivered"][data-state="current"]').count();
      }, { timeout: 60_000, interval: 2_000 })
      .toBe(1);
    await page.getByTestId('tracking-status-outbound').getByText(/Delivered/).waitFor();
    await page.getByTestId('core-clock').getByText(/business days? left|Due/).waitFor();
    await waitForMail(DEALER, (m) => m.subject.includes(claim.number) && /delivered/.test(m.subject), 30_000);

    const instructions = page.getByTestId('return-instructions');
    await instructions.getByTestId('dg-marks').getByText('"DAMAGED/DEFECTIVE LITHIUM ION BATTERIES"').waitFor();
    await instructions.getByTestId('dg-cautions').getByText(/If the battery is hot, swollen, smoking, venting or leaking, do not ship it/).waitFor();
    const labelHref = await page.getByTestId('return-label-link').getAttribute('href');
    const label = await context.request.get(labelHref!);
    expect(label.status()).toBe(200);
    expect(await pdfText(Buffer.from(await label.body()))).toMatch(/DAMAGED\/DEFECTIVE LITHIUM ION BATTERIES\s+·\s+GROUND\s+ONLY/);
    await screenshot(page, 'fulfilment-dealer-delivered');

    const form = page.getByTestId('core-shipped-form');
    expect(await form.getByRole('button', { name: 'Mark the core shipped' }).isDisabled()).toBe(true);
    await form.getByRole('checkbox').check();
    await form.getByRole('button', { name: 'Mark the core shipped' }).click();
    await page.getByTestId('core-track').locator('[data-step="in_transit"][data-state="current"]').waitFor();
    await screenshot(page, 'fulfilment-dealer-core-shipped');
    await context.close();
  });

  it('the warehouse scans the RMA, receives the core and records the inspection with a photo', async () => {
    const { page } = await newPage(browser);
    await signIn(page, WAREHOUSE);
    await page.goto('/warehouse');
    const scan = page.getByLabel('Receive a core: scan or type the RMA number');
    // A mistyped number is caught by its check digit before anything is looked up.
    const wrong = claim.rmaNumber!.slice(0, -1) + String((Number(claim.rmaNumber!.slice(-1)) + 1) % 10);
    await scan.fill(wrong);
    await scan.press('Enter');
    await page.getByTestId('rma-scan').getByText(/check digit does not match/).waitFor();
    // A scanner types the number and presses Enter.
    await scan.fill('');
    await scan.pressSequentially(claim.rmaNumber!.replace(/-/g, ''), { delay: 5 });
    await scan.press('Enter');
    await page.waitForURL(new RegExp(`/warehouse/claims/${claim.id}`));

    const receive = page.getByTestId('receive-section');
    await receive.getByText('Declared damaged or defective').waitFor();
    await receive.getByRole('radio', { name: /Arrived as described/ }).check();
    await receive.getByLabel('Notes on arrival (optional)').fill('Inner bag intact, cushioning in place, no heat');
    await receive.getByRole('button', { name: 'Receive the core' }).click();

    const inspect = page.getByTestId('inspect-section');
    await inspect.waitFor();
    expect(await inspect.getByRole('button', { name: 'Record the inspection' }).isDisabled()).toBe(true);
    await inspect.getByTestId('dropzone-inspection_photo').locator('input[type=file]').setInputFiles(path.join(dir, 'core-on-bench.jpg'));
    await inspect.getByText('1 inspection photo on the claim.').waitFor({ timeout: 30_000 });
    await inspect.getByRole('radio', { name: /Fault confirmed/ }).check();
    await inspect.getByLabel(/Inspection notes/).fill('Cell group 3 swollen, 0.4 V below the rest: manufacturing defect.');
    await screenshot(page, 'fulfilment-inspect');
    await inspect.getByRole('button', { name: 'Record the inspection' }).click();
    await page.getByTestId('core-track').locator('[data-step="inspected"][data-state="done"]').waitFor();
    await page.getByText('Inspection: Fault confirmed').waitFor();
    await screenshot(page, 'fulfilment-inspected');
  });

  it('the dealer sees the inspection result on the claim', async () => {
    const { page } = await newPage(browser);
    await signIn(page, DEALER);
    await page.goto(`/claims/${claim.id}`);
    await page.getByText('Inspection: Fault confirmed').waitFor();
    await page.getByTestId('timeline').getByText('Core inspected', { exact: true }).waitFor();
    await screenshot(page, 'fulfilment-dealer-inspected');
  });
});

describe('fulfilment: a back-ordered part', () => {
  it('the dealer sees the line back-ordered with the date the warehouse expects more', async () => {
    const { page } = await newPage(browser);
    await signIn(page, DEALER);
    await page.goto(`/claims/${backordered.id}`);
    await page.getByTestId('fulfilment').getByText(/expected in the warehouse on 1 Feb 2027/).waitFor();
    await screenshot(page, 'fulfilment-dealer-backordered');
  });
});

describe('fulfilment: a rep waives the core return', () => {
  it('with a photo of the local recycling as proof; the core track ends there', async () => {
    const { page } = await newPage(browser);
    await signIn(page, 'priya.nair@torvane.test');
    await page.goto(`/claims/${recycled.id}`);
    await page.getByText('Waive the return (local recycling or scrapping)').click();
    const waive = page.getByTestId('waive-form');
    expect(await waive.getByRole('button', { name: 'Waive the core return' }).isDisabled()).toBe(true);
    await page.getByTestId('dropzone-core_disposal_proof').locator('input[type=file]').setInputFiles(path.join(dir, 'recycler-receipt.jpg'));
    await expect.poll(() => waive.locator('option').count(), { timeout: 30_000 }).toBe(1);
    await waive.getByRole('radio', { name: /Recycled locally/ }).check();
    await screenshot(page, 'fulfilment-rep-waive');
    await waive.getByRole('button', { name: 'Waive the core return' }).click();
    await page.getByTestId('core-track').locator('[data-step="waived"]').waitFor();
    await page.getByText('The core stays with the shop').waitFor();
  });
});
