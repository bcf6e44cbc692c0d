import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dynoCsv, labelPhoto } from '../support/evidence-files';
import { launch, newPage, screenshot, signIn, waitForMail } from './support/browser';

const DEALER = 'lena.hartmann@kettenblatt.test';
const REP = 'priya.nair@torvane.test';

let browser: Browser;
let dir: string;
beforeAll(async () => {
  browser = await launch();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lp-review-'));
  fs.writeFileSync(path.join(dir, 'serial-label.jpg'), await labelPhoto('SN DU85-2503-11872'));
  fs.writeFileSync(path.join(dir, 'drive-unit.jpg'), await labelPhoto('TV-DU85 on the bench'));
  fs.writeFileSync(path.join(dir, 'connector-pins.jpg'), await labelPhoto('connector pins close-up'));
  fs.writeFileSync(path.join(dir, 'dyno-before.csv'), dynoCsv({ peakW: 190 }));
});
afterAll(async () => {
  await browser?.close();
});

async function fileClaim(page: Page): Promise<{ id: string; number: string }> {
  await page.goto('/claims/new');
  await page.getByLabel('Brand the claim goes to').selectOption({ label: 'Torvane Drive Systems (account TV-DE-0791)' });
  await page.getByLabel('Frame serial').fill('KT25-004187');
  await page.getByTestId('registry-result').getByText('Registered: Kestrel Trek 625').waitFor();
  await page.getByLabel('Failed part').selectOption({ label: 'TV-DU85 — Drive unit DU85 (mid motor)' });
  await page.getByLabel('Failure date').fill('2026-11-24');
  await page.getByLabel('What the rider noticed').fill('Assist drops out on climbs, then returns');
  await page.getByLabel('Your diagnosis').fill('Wheel power collapses above 14 km/h on the dyno; battery and connectors checked.');
  await page.getByTestId('requested-part').getByLabel('Quantity').fill('2');
  await page.getByLabel(/Freight you paid/).fill('18.50');
  await page.getByRole('button', { name: 'Save draft and add evidence' }).click();
  await page.waitForURL(/\/claims\/[0-9a-f-]{36}$/);
  const id = page.url().split('/').pop()!;
  const number = (await page.getByTestId('claim-number').textContent())!.trim();
  await page.getByTestId('dropzone-serial_label_photo').locator('input[type=file]').setInputFiles(path.join(dir, 'serial-label.jpg'));
  await page.getByTestId('dropzone-photo').locator('input[type=file]').setInputFiles(path.join(dir, 'drive-unit.jpg'));
  await page.getByTestId('dropzone-load_test_before').locator('input[type=file]').setInputFiles(path.join(dir, 'dyno-before.csv'));
  await page.getByText('Ready to submit').waitFor();
  await page.getByRole('button', { name: 'Submit to the brand' }).click();
  await page.getByTestId('dealer-review').getByText('With the brand').waitFor();
  return { id, number };
}

/** A mail about this claim: the link in it carries the claim's id, which no other database shares. */
const about = (id: string, subject: RegExp) => (m: { subject: string; text: string }) => subject.test(m.subject) && m.text.includes(`/claims/${id}`);

describe('a rep asks for more, the dealer answers, the rep approves in part', () => {
  it('runs from submission to an RMA with changed lines, with an e-mail for each step', async () => {
    const dealer = await newPage(browser);
    await signIn(dealer.page, DEALER);
    const claim = await fileClaim(dealer.page);
    await screenshot(dealer.page, 'review-dealer-submitted');

    // The rep finds it in the queue, with its deadline in business days, and takes it.
    const rep = await newPage(browser);
    await signIn(rep.page, REP);
    await rep.page.goto('/review');
    await rep.page.getByLabel('Search').fill(claim.number);
    const row = rep.page.getByTestId('queue-row').filter({ hasText: claim.number });
    await row.waitFor();
    expect(await row.textContent()).toMatch(/business days? left|Due today/);
    await rep.page.getByTestId('deadline-rule').getByText(/ISDA 'Following'/).waitFor();
    await rep.page.getByLabel('Search').fill('');
    await rep.page.waitForTimeout(400); // the search box waits 250 ms before it asks
    await rep.page.waitForLoadState('networkidle');
    await screenshot(rep.page, 'review-queue');
    await rep.page.getByLabel('Search').fill(claim.number);
    await row.getByRole('button', { name: `Take ${claim.number}` }).click();
    await rep.page.waitForURL(`**/claims/${claim.id}`);
    await rep.page.getByTestId('assigned-rep').getByText('You').waitFor();
    await screenshot(rep.page, 'review-claim-taken');

    // Ask for more: a checklist and a message.
    await rep.page.getByRole('tab', { name: 'Ask for more' }).click();
    await rep.page.getByLabel('More photos').check();
    await rep.page.getByLabel('Photos of what?').fill('the connector pins at the motor, in focus');
    await rep.page.getByLabel('Message to the dealer').fill('The first photo is blurred at the connector; we need to rule out corrosion.');
    await rep.page.getByRole('button', { name: 'Ask the dealer' }).click();
    await rep.page.getByTestId('since-request').getByText('Asked for more; waiting on the dealer').waitFor();
    await rep.page.getByTestId('decision-closed').waitFor();

    // The dealer sees the checklist, adds a photo, answers and resubmits.
    await dealer.page.reload();
    const request = dealer.page.getByTestId('info-request');
    await request.getByText('More photos: the connector pins at the motor, in focus').waitFor();
    await request.getByText('we need to rule out corrosion', { exact: false }).waitFor();
    await dealer.page.getByTestId('dropzone-photo').locator('input[type=file]').setInputFiles(path.join(dir, 'connector-pins.jpg'));
    await request.getByText('connector-pins.jpg').waitFor();
    await dealer.page.getByLabel('Your answer to the rep').fill('Close-up of the pins attached: clean, no corrosion.');
    await screenshot(dealer.page, 'review-dealer-asked');
    await dealer.page.getByRole('button', { name: 'Send the requested items' }).click();
    await dealer.page.getByTestId('dealer-review').getByText('A warranty rep is reviewing your claim.', { exact: false }).waitFor();

    // The rep sees what changed since the request, and approves in part: one unit, no separate load-test time.
    await rep.page.reload();
    const since = rep.page.getByTestId('since-request');
    await since.getByText('What the dealer sent since you asked').waitFor();
    await since.getByTestId('new-evidence').filter({ hasText: 'connector-pins.jpg' }).waitFor();
    await since.getByText('clean, no corrosion', { exact: false }).waitFor();
    await rep.page.getByTestId('evidence-check').getByText('new').first().waitFor();
    await rep.page.getByRole('tab', { name: 'Approve' }).click();
    await rep.page.getByLabel('Quantity approved').fill('1');
    await rep.page.getByTestId('approve-line-l2').getByLabel('Hours').fill('0');
    const changes = rep.page.getByTestId('approval-changes');
    await changes.getByText('TV-DU85: quantity 2 → 1').waitFor();
    await changes.getByText('LT-BA: not approved (asked 0.80 h)').waitFor();
    await screenshot(rep.page, 'review-approve-in-part');
    await rep.page.getByRole('button', { name: 'Approve in part' }).click();
    const decision = rep.page.getByTestId('decision');
    await decision.getByText('Approved in part').waitFor();
    const rma = (await decision.getByTestId('decision-rma').textContent())!.trim();
    expect(rma).toMatch(/^RMA-\d{4}-\d{6}-\d$/);

    // The dealer sees the RMA number and the changed lines.
    await dealer.page.reload();
    expect((await dealer.page.getByTestId('rma-number').textContent())!.trim()).toBe(rma);
    const lines = dealer.page.getByTestId('dealer-review').getByTestId('compared-line');
    expect(await lines.evaluateAll((rows) => rows.map((r) => (r as HTMLElement).dataset.status))).toEqual(['changed', 'as_requested', 'not_approved', 'as_requested']);
    await dealer.page.getByTestId('dealer-review').getByText('Approved in part').waitFor();
    await screenshot(dealer.page, 'review-dealer-approved');

    // The thread and the timeline carry every message.
    await dealer.page.getByTestId('message-thread').getByText('we need to rule out corrosion', { exact: false }).waitFor();

    // Each step's e-mail reached the fake mailbox, to the right person, linking to this claim.
    await waitForMail(REP, about(claim.id, /New claim/));
    await waitForMail(DEALER, about(claim.id, /needs more on claim/));
    await waitForMail(REP, about(claim.id, /sent what you asked for/));
    const approved = await waitForMail(DEALER, about(claim.id, /approved in part: RMA/));
    expect(approved.subject).toContain(rma);
    expect(approved.text).toContain('TV-DU85: quantity 2 → 1');

    await dealer.context.close();
    await rep.context.close();
  });
});
