import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { parseDocumentNumber } from '@/lib/credits';
import { brandCalendar, clockEventsFor } from '@/lib/db/review';
import { reviewDeadline } from '@/lib/review';
import {
  claimRow, DEALER, DEALER_ADMIN, events, FOREIGN_REP, fullApproval, laborId, notesFor, OTHER_DEALER, REP, REP2, step, submittedClaim, take,
  versionOf, WAREHOUSE,
} from './support';

async function inReview(rep = REP) {
  const c = await submittedClaim();
  expect((await take(rep, c.id)).status).toBe(200);
  return c;
}

async function rmaSequence(brandId: string): Promise<number> {
  const row = await db()('document_sequences').where({ brand_id: brandId, kind: 'rma', year: new Date().getUTCFullYear() }).first('last_value');
  return row?.last_value ?? 0;
}

/** Everything a refused step must leave as it was. */
async function snapshot(id: string) {
  const c = await claimRow(id);
  return {
    version: c.version, stage: c.stage, rma: c.rma_number, approved: c.approved_lines, due: c.review_due_on,
    events: (await events(id)).length, notes: (await notesFor(id)).length,
  };
}

describe('taking and releasing', () => {
  it('a rep takes a submitted claim and releases it back to the queue', async () => {
    const c = await submittedClaim();
    const before = await claimRow(c.id);
    expect(before.stage).toBe('submitted');
    expect(before.review_started_at).not.toBeNull();
    expect(before.review_due_on).not.toBeNull();
    const r = await take(REP, c.id);
    expect(r).toMatchObject({ status: 200, body: { stage: 'in_review' } });
    const taken = await claimRow(c.id);
    expect(taken.assigned_rep_id).toBe((await db()('users').where({ email: REP }).first('id')).id);
    // Taking does not move the deadline.
    expect(taken.review_due_on).toEqual(before.review_due_on);

    const other = await step(REP2, c.id, { type: 'RELEASE', version: await versionOf(c.id) });
    expect(other.status).toBe(409);
    expect(other.body.error).toBe('Only the rep assigned to this claim can release it.');
    const released = await step(REP, c.id, { type: 'RELEASE', version: await versionOf(c.id), note: 'Out of office' });
    expect(released).toMatchObject({ status: 200, body: { stage: 'submitted' } });
    expect((await claimRow(c.id)).assigned_rep_id).toBeNull();
  });

  it('two reps taking the same claim at once: one gets it, the other is told who was faster', async () => {
    const c = await submittedClaim();
    const v = await versionOf(c.id);
    const [a, b] = await Promise.all([step(REP, c.id, { type: 'TAKE', version: v }), step(REP2, c.id, { type: 'TAKE', version: v })]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect((await events(c.id, 'TAKE')).length).toBe(1);
    const loser = a.status === 409 ? a : b;
    expect(loser.body).toMatchObject({ stage: 'in_review' });
  });
});

describe('approving', () => {
  it('in full: an RMA number of our format, the approved lines as requested, the dealer told by mail', async () => {
    const c = await inReview();
    const seq = await rmaSequence(c.brandId);
    const r = await step(REP, c.id, { type: 'APPROVE', version: await versionOf(c.id), ...(await fullApproval(c.id)) });
    expect(r.status).toBe(200);
    const row = await claimRow(c.id);
    expect(row.stage).toBe('approved');
    expect(row.replacement_step).toBe('to_ship');
    expect(row.core_step).toBe('requested');
    const parsed = parseDocumentNumber(row.rma_number);
    expect(parsed).toMatchObject({ ok: true, kind: 'rma', year: new Date().getUTCFullYear(), sequence: seq + 1 });
    expect(row.approved_lines).toEqual(row.requested_lines);
    expect(row.context.decision).toMatchObject({ outcome: 'full' });
    expect(row.context.rmaNumber).toBe(row.rma_number);
    expect(row.review_due_on).toBeNull();
    const [event] = await events(c.id, 'APPROVE');
    expect(event.payload).toMatchObject({ extent: 'full', rmaNumber: row.rma_number });
    expect(event.payload.lines.every((l: { approved: boolean; changed?: boolean }) => l.approved && !l.changed)).toBe(true);
    // The shop: whoever filed the claim and its admin, each with a notification and a queued mail.
    const notes = (await notesFor(c.id)).filter((n) => n.kind === 'approved');
    expect(notes.map((n) => n.email).sort()).toEqual([DEALER_ADMIN, DEALER].sort());
    expect(notes.every((n) => n.mailTo === n.email && n.subject.includes(row.rma_number))).toBe(true);
  });

  it('in part: fewer parts, a labor line dropped, less freight; each change is recorded and told', async () => {
    const c = await inReview();
    const body = await fullApproval(c.id);
    body.parts[0]!.quantity = 1;
    body.labor[1]!.hours = '0';
    body.freight = '10.00';
    const r = await step(REP, c.id, { type: 'APPROVE', version: await versionOf(c.id), ...body, message: 'One unit is enough; the load test is part of the refit time.' });
    expect(r.status).toBe(200);
    const row = await claimRow(c.id);
    expect(row.context.decision.outcome).toBe('partial');
    expect(row.approved_lines.parts).toEqual([{ ...row.requested_lines.parts[0], quantity: 1 }]);
    expect(row.approved_lines.labor).toEqual([row.requested_lines.labor[0]]);
    expect(row.approved_lines.freightMinor).toBe(1000);
    expect(row.context.approvedLines).toEqual([
      { lineId: 'p1', approved: true, changed: true, note: 'TV-DU85: quantity 2 → 1' },
      { lineId: 'l1', approved: true },
      { lineId: 'l2', approved: false, note: 'LT-BA: not approved (asked 0.80 h)' },
      { lineId: 'freight', approved: true, changed: true, note: 'Freight: 18.50 EUR → 10.00 EUR' },
    ]);
    const mail = (await notesFor(c.id)).find((n) => n.kind === 'approved' && n.email === DEALER);
    expect(mail?.title).toMatch(/approved in part: RMA RMA-/);
    const [outbox] = await db()('outbox').where({ claim_id: c.id, to_email: DEALER }).whereILike('subject', '%approved in part%').select('text_body');
    expect(outbox.text_body).toContain('TV-DU85: quantity 2 → 1');
    expect(outbox.text_body).toContain(`/claims/${c.id}`);
  });

  it('in part with another operation from the schedule, at most its scheduled hours', async () => {
    const c = await inReview();
    const body = await fullApproval(c.id);
    body.labor[0] = { ...body.labor[0]!, operationId: await laborId(c.brandId, 'CT-RR'), hours: '0.80' };
    expect((await step(REP, c.id, { type: 'APPROVE', version: await versionOf(c.id), ...body })).status).toBe(200);
    const row = await claimRow(c.id);
    expect(row.approved_lines.labor[0]).toMatchObject({ lineId: 'l1', code: 'CT-RR', hours: '0.80' });
    expect(row.context.approvedLines[1]).toEqual({ lineId: 'l1', approved: true, changed: true, note: 'DU-RR 1.20 h → CT-RR 0.80 h' });
  });

  const badLines: [string, (b: Awaited<ReturnType<typeof fullApproval>>) => Promise<void> | void, string, RegExp][] = [
    ['a negative quantity', (b) => void (b.parts[0]!.quantity = -1), 'parts.0.quantity', /cannot be negative/],
    ['more than requested', (b) => void (b.parts[0]!.quantity = 3), 'parts.0.quantity', /At most 2: the dealer asked for 2/],
    ['half a part', (b) => void (b.parts[0]!.quantity = 1.5), 'parts.0.quantity', /Whole parts only/],
    ['an unknown labor operation', (b) => void (b.labor[0]!.operationId = randomUUID()), 'labor.0.operationId', /Not an operation in the brand’s labor schedule/],
    ['another brand’s labor operation', async (b) => {
      const wrenfield = (await db()('organisations').where({ slug: 'wrenfield' }).first('id')).id;
      b.labor[0]!.operationId = await laborId(wrenfield, 'HM-WHL');
    }, 'labor.0.operationId', /Not an operation/],
    ['negative hours', (b) => void (b.labor[0]!.hours = '-1'), 'labor.0.hours', /cannot be negative/],
    ['more hours than scheduled', (b) => void (b.labor[0]!.hours = '1.5'), 'labor.0.hours', /At most 1.20 h, the scheduled time for DU-RR/],
    ['more freight than asked', (b) => void (b.freight = '25'), 'freight', /At most 18.50 EUR/],
    ['negative freight', (b) => void (b.freight = '-2'), 'freight', /cannot be negative/],
    ['a line left out', (b) => void b.labor.pop(), 'labor', /Labor line l2 \(LT-BA\) has no hours/],
    ['nothing approved', (b) => {
      b.parts[0]!.quantity = 0;
      b.labor.forEach((l: { hours: string }) => (l.hours = '0'));
      b.freight = '0';
    }, '_form', /deny the claim instead/],
  ];

  it.each(badLines)('refuses %s with 422 and a message on the field; nothing changes, no RMA number is used', async (_name, spoil, field, text) => {
    const c = await inReview();
    const body = await fullApproval(c.id);
    await spoil(body);
    const before = await snapshot(c.id);
    const seq = await rmaSequence(c.brandId);
    const r = await step(REP, c.id, { type: 'APPROVE', version: before.version, ...body });
    expect(r.status).toBe(422);
    expect(r.body.fieldErrors[field]?.[0]).toMatch(text);
    expect(await snapshot(c.id)).toEqual(before);
    expect(await rmaSequence(c.brandId)).toBe(seq);
  });

  it('refuses deciding a claim assigned to another rep (409), and one not in review (409); nothing changes', async () => {
    const c = await inReview(REP);
    const before = await snapshot(c.id);
    const r = await step(REP2, c.id, { type: 'APPROVE', version: before.version, ...(await fullApproval(c.id)) });
    expect(r).toMatchObject({ status: 409, body: { error: 'Only the rep assigned to this claim can approve it.', stage: 'in_review' } });
    const d = await step(REP2, c.id, { type: 'DENY', version: before.version, reasonCode: 'wear_item', message: 'Worn' });
    expect(d).toMatchObject({ status: 409, body: { error: 'Only the rep assigned to this claim can deny it.' } });
    expect(await snapshot(c.id)).toEqual(before);

    const waiting = await submittedClaim();
    const w = await snapshot(waiting.id);
    const notTaken = await step(REP, waiting.id, { type: 'APPROVE', version: w.version, ...(await fullApproval(waiting.id)) });
    expect(notTaken).toMatchObject({ status: 409, body: { error: 'Take this claim for review first.', stage: 'submitted' } });
    // Even with bad lines, the state refusal comes first.
    const bad = await step(REP, waiting.id, { type: 'APPROVE', version: w.version, parts: [{ lineId: 'p1', quantity: -4 }] });
    expect(bad.status).toBe(409);
    expect(await snapshot(waiting.id)).toEqual(w);
  });

  it('refuses the wrong role (403) and another brand’s rep or another shop (404)', async () => {
    const c = await inReview();
    const before = await snapshot(c.id);
    expect(await step(DEALER, c.id, { type: 'APPROVE', version: before.version })).toMatchObject({ status: 403, body: { error: 'Only a brand rep can approve a claim.' } });
    expect((await step(WAREHOUSE, c.id, { type: 'DENY', version: before.version, reasonCode: 'wear_item', message: 'x' })).status).toBe(403);
    expect((await step(FOREIGN_REP, c.id, { type: 'APPROVE', version: before.version, ...(await fullApproval(c.id)) })).status).toBe(404);
    expect((await step(FOREIGN_REP, c.id, { type: 'TAKE', version: before.version })).status).toBe(404);
    expect((await step(OTHER_DEALER, c.id, { type: 'WITHDRAW', version: before.version })).status).toBe(404);
    expect(await snapshot(c.id)).toEqual(before);
  });

  it('two reps deciding one claim at once: exactly one decision, one RMA number', async () => {
    const c = await inReview(REP);
    const v = await versionOf(c.id);
    const body = await fullApproval(c.id);
    const results = await Promise.all([
      step(REP, c.id, { type: 'APPROVE', version: v, ...body }),
      step(REP2, c.id, { type: 'APPROVE', version: v, ...body }),
      step(REP, c.id, { type: 'DENY', version: v, reasonCode: 'wear_item', message: 'Worn brushes' }),
    ]);
    expect(results.filter((r) => r.status === 200)).toHaveLength(1);
    expect(results.filter((r) => r.status === 409)).toHaveLength(2);
    const decisions = (await events(c.id)).filter((e) => e.event === 'APPROVE' || e.event === 'DENY');
    expect(decisions).toHaveLength(1);
    const row = await claimRow(c.id);
    expect(row.version).toBe(v + 1);
    expect(row.stage === 'approved' ? !!row.rma_number : row.rma_number === null).toBe(true);
  });

  it('the same approval sent twice is one approval', async () => {
    const c = await inReview();
    const v = await versionOf(c.id);
    const body = { type: 'APPROVE', version: v, ...(await fullApproval(c.id)) };
    expect((await step(REP, c.id, body)).status).toBe(200);
    const again = await step(REP, c.id, body);
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/changed since you opened it/);
    expect((await events(c.id, 'APPROVE')).length).toBe(1);
  });
});

describe('asking for more', () => {
  it('the rep asks with a checklist; the clock pauses; the dealer answers and resubmits; the clock runs again', async () => {
    const c = await inReview();
    const due = (await claimRow(c.id)).review_due_on;
    const r = await step(REP, c.id, {
      type: 'REQUEST_INFO', version: await versionOf(c.id),
      items: [{ key: 'photos', detail: 'the connector pins at the motor' }, { key: 'load_test', detail: '' }, { key: 'other', detail: 'The firmware version' }],
      message: 'The pins look corroded on the first photo; please check.',
    });
    expect(r).toMatchObject({ status: 200, body: { stage: 'waiting_on_dealer' } });
    const waiting = await claimRow(c.id);
    expect(waiting.review_due_on).toBeNull();
    expect(waiting.context.infoRequests.lastChecklist).toEqual([
      'More photos: the connector pins at the motor',
      'A new load test before the repair',
      'The firmware version',
    ]);
    const asked = (await notesFor(c.id)).filter((n) => n.kind === 'more_requested');
    expect(asked.map((n) => n.email).sort()).toEqual([DEALER_ADMIN, DEALER].sort());

    expect(await step(REP, c.id, { type: 'REQUEST_INFO', version: await versionOf(c.id), items: [{ key: 'proof_of_purchase' }], message: 'x' }))
      .toMatchObject({ status: 409, body: { error: 'The dealer was already asked; wait for the resubmission.' } });
    expect((await step(REP, c.id, { type: 'RESUBMIT', version: await versionOf(c.id) })).status).toBe(403);

    const back = await step(DEALER, c.id, { type: 'RESUBMIT', version: await versionOf(c.id), message: 'New photos and run attached; firmware 4.2.1.' });
    expect(back).toMatchObject({ status: 200, body: { stage: 'in_review' } });
    const resumed = await claimRow(c.id);
    expect(resumed.assigned_rep_id).toBe(waiting.assigned_rep_id);
    expect(resumed.review_due_on).not.toBeNull();
    expect(resumed.review_due_on >= due).toBe(true);
    // The stored date is the clock read from the log at the resubmission (the pause closed by it).
    const cal = await brandCalendar(c.brandId);
    const log = (await clockEventsFor([c.id])).get(c.id)!;
    const expected = reviewDeadline({
      startedAt: new Date(resumed.review_started_at).toISOString(), now: log.at(-1)!.at, timeZone: cal.timeZone,
      calendar: { holidays: cal.holidays }, reviewDays: 5, events: log,
    });
    expect(log.map((e) => e.event)).toEqual(['SUBMIT', 'REQUEST_INFO', 'RESUBMIT']);
    expect(resumed.review_due_on).toBe(expected.dueDate);
    const told = (await notesFor(c.id)).filter((n) => n.kind === 'resubmitted');
    expect(told.map((n) => n.email)).toEqual([REP]); // only the assigned rep
    const [ev] = await events(c.id, 'RESUBMIT');
    expect(ev.payload.message).toBe('New photos and run attached; firmware 4.2.1.');
  });

  it.each([
    ['no item', { items: [], message: 'More please' }, 'items', /Tick at least one/],
    ['photos without saying of what', { items: [{ key: 'photos', detail: ' ' }], message: 'More please' }, 'detail.photos', /Photos of what/],
    ['an item we do not know', { items: [{ key: 'selfie' }], message: 'More please' }, 'items.0.key', /Not an item/],
    ['no message', { items: [{ key: 'diagnostic_log' }], message: '  ' }, 'message', /Write the dealer a message/],
  ])('refuses a request with %s (422) and nothing changes', async (_n, body, field, text) => {
    const c = await inReview();
    const before = await snapshot(c.id);
    const r = await step(REP, c.id, { type: 'REQUEST_INFO', version: before.version, ...body });
    expect(r.status).toBe(422);
    expect(r.body.fieldErrors[field]?.[0]).toMatch(text);
    expect(await snapshot(c.id)).toEqual(before);
  });
});

describe('denying and appealing', () => {
  it('deny with a reason; the dealer appeals once; another rep reviews; a second appeal is refused', async () => {
    const c = await inReview(REP);
    const before = Date.now();
    const d = await step(REP, c.id, { type: 'DENY', version: await versionOf(c.id), reasonCode: 'water_ingress', message: 'Corrosion inside the motor housing.' });
    expect(d).toMatchObject({ status: 200, body: { stage: 'denied' } });
    const denied = await claimRow(c.id);
    expect(denied.context.decision).toMatchObject({ outcome: 'denied', reasonCode: 'water_ingress', message: 'Corrosion inside the motor housing.' });
    // Torvane's drive-unit policy gives 30 days to appeal (demo policy).
    const window = Date.parse(denied.context.appealOpenUntil) - before;
    expect(window).toBeGreaterThan(30 * 86400_000 - 60_000);
    expect(window).toBeLessThan(30 * 86400_000 + 60_000);
    const deniedNote = (await notesFor(c.id)).find((n) => n.kind === 'denied' && n.email === DEALER);
    expect(deniedNote?.title).toBe(`Claim ${c.number} denied: water got in`);

    const bad = await step(DEALER, c.id, { type: 'APPEAL', version: await versionOf(c.id), message: '' });
    expect(bad.status).toBe(422);
    const a = await step(DEALER, c.id, { type: 'APPEAL', version: await versionOf(c.id), message: 'The seal was intact; see the new photo.' });
    expect(a).toMatchObject({ status: 200, body: { stage: 'appealed' } });
    const appealed = await claimRow(c.id);
    expect(new Date(appealed.review_started_at).getTime()).toBeGreaterThan(new Date(denied.review_started_at).getTime());
    expect(appealed.review_due_on).not.toBeNull();
    // The appeal goes to the reps other than the one who denied.
    const told = (await notesFor(c.id)).filter((n) => n.kind === 'appealed').map((n) => n.email);
    expect(told).toEqual([REP2]);

    const self = await step(REP, c.id, { type: 'TAKE', version: await versionOf(c.id) });
    expect(self).toMatchObject({ status: 409, body: { error: 'The rep who denied this claim cannot review its appeal; another rep of the brand must take it.' } });
    expect((await take(REP2, c.id)).status).toBe(200);
    expect((await step(REP2, c.id, { type: 'DENY', version: await versionOf(c.id), reasonCode: 'water_ingress', message: 'Confirmed on review.' })).status).toBe(200);
    const second = await step(DEALER, c.id, { type: 'APPEAL', version: await versionOf(c.id), message: 'Again' });
    expect(second).toMatchObject({ status: 409, body: { error: 'A denial can be appealed once; this claim was appealed already.' } });
    expect((await events(c.id, 'APPEAL')).length).toBe(1);
  });

  it('an appeal after the window is refused with the date it closed', async () => {
    const c = await inReview();
    await step(REP, c.id, { type: 'DENY', version: await versionOf(c.id), reasonCode: 'wear_item', message: 'Worn' });
    // Move the window into the past, as if the 30 days had gone by.
    await db()('claims').where({ id: c.id }).update({ context: db().raw(`jsonb_set(context, '{appealOpenUntil}', '"2026-01-10T12:00:00.000Z"')`) });
    const before = await snapshot(c.id);
    const r = await step(DEALER, c.id, { type: 'APPEAL', version: before.version, message: 'Please look again' });
    expect(r).toMatchObject({ status: 409, body: { error: 'The appeal window closed on 2026-01-10 at 12:00 UTC.', stage: 'denied' } });
    expect(await snapshot(c.id)).toEqual(before);
  });

  it('when the brand has no other rep, the rep who denied may take the appeal', async () => {
    const c = await inReview(REP);
    await step(REP, c.id, { type: 'DENY', version: await versionOf(c.id), reasonCode: 'crash_or_impact', message: 'Housing cracked.' });
    await step(DEALER, c.id, { type: 'APPEAL', version: await versionOf(c.id), message: 'It cracked from a manufacturing flaw.' });
    await db()('users').where({ email: REP2 }).update({ disabled_at: db().fn.now() });
    try {
      expect(await take(REP, c.id)).toMatchObject({ status: 200, body: { stage: 'in_review' } });
    } finally {
      await db()('users').where({ email: REP2 }).update({ disabled_at: null });
    }
  });

  it('refuses a denial without a reason of our list or without a message (422)', async () => {
    const c = await inReview();
    const before = await snapshot(c.id);
    const r1 = await step(REP, c.id, { type: 'DENY', version: before.version, reasonCode: 'looks_used', message: 'x' });
    expect(r1.status).toBe(422);
    expect(r1.body.fieldErrors.reasonCode[0]).toBe('Choose the reason from the list.');
    const r2 = await step(REP, c.id, { type: 'DENY', version: before.version, reasonCode: 'wear_item', message: '' });
    expect(r2.body.fieldErrors.message[0]).toMatch(/Tell the dealer why/);
    expect(await snapshot(c.id)).toEqual(before);
  });
});
