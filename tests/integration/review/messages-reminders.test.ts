import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { addBusinessDays, localDate } from '@/lib/calendar';
import { remindReviewDeadlines } from '@/lib/jobs/review-deadlines';
import { brandCalendar } from '@/lib/db/review';
import { claimRow, DEALER, DEALER_ADMIN, events, FOREIGN_REP, message, notesFor, OTHER_DEALER, REP, REP2, step, submittedClaim, take, versionOf, WAREHOUSE } from './support';

describe('the claim’s thread', () => {
  it('dealer and rep write to each other; every message is in the log; the other side is told', async () => {
    const c = await submittedClaim();
    await take(REP, c.id);
    const before = (await claimRow(c.id)).version;
    expect(await message(DEALER, c.id, { message: 'The customer needs the bike for commuting; any news?', clientKey: randomUUID() })).toMatchObject({ status: 201, body: { duplicate: false } });
    expect((await message(REP, c.id, { message: 'Looking at it today.' })).status).toBe(201);
    const log = await events(c.id, 'MESSAGE');
    expect(log.map((e) => e.payload.message)).toEqual(['The customer needs the bike for commuting; any news?', 'Looking at it today.']);
    expect(log.map((e) => e.actor_role)).toEqual(['dealer', 'brand_rep']);
    // A message is not a state change: the claim's version and state stay.
    const row = await claimRow(c.id);
    expect([row.version, row.stage]).toEqual([before, 'in_review']);
    const notes = (await notesFor(c.id)).filter((n) => n.kind === 'message');
    expect(notes.filter((n) => n.title.startsWith('Message from Kettenblatt')).map((n) => n.email)).toEqual([REP]); // the assigned rep only
    expect(notes.filter((n) => n.title.startsWith('Message from Torvane')).map((n) => n.email).sort()).toEqual([DEALER_ADMIN, DEALER].sort());
    expect(notes.every((n) => n.mailTo === n.email)).toBe(true);
  });

  it('while nobody has the claim, a dealer’s message goes to every rep of the brand', async () => {
    const c = await submittedClaim();
    await message(DEALER, c.id, { message: 'Is anyone on this?' });
    const to = (await notesFor(c.id)).filter((n) => n.kind === 'message').map((n) => n.email).sort();
    expect(to).toEqual([REP2, REP].sort());
  });

  it('the same message sent twice (same key), even at the same moment, is one message and one notification', async () => {
    const c = await submittedClaim();
    const clientKey = randomUUID();
    const body = { message: 'Photos attached.', clientKey };
    const [a, b] = await Promise.all([message(DEALER, c.id, body), message(DEALER, c.id, body)]);
    expect([a.body.duplicate, b.body.duplicate].sort()).toEqual([false, true]);
    expect(await message(DEALER, c.id, body)).toMatchObject({ status: 200, body: { duplicate: true } });
    expect((await events(c.id, 'MESSAGE')).length).toBe(1);
    expect((await notesFor(c.id)).filter((n) => n.kind === 'message').length).toBe(2); // the two reps, once each
  });

  it('refuses an empty message (422), a draft (409), another shop or brand (404) and other roles (403)', async () => {
    const c = await submittedClaim();
    const r = await message(DEALER, c.id, { message: '   ' });
    expect(r.status).toBe(422);
    expect(r.body.fieldErrors.message[0]).toBe('Write a message first.');
    expect((await message(DEALER, c.id, { message: 'x', clientKey: 'not-a-uuid' })).status).toBe(422);
    expect((await message(OTHER_DEALER, c.id, { message: 'Hello' })).status).toBe(404);
    expect((await message(FOREIGN_REP, c.id, { message: 'Hello' })).status).toBe(404);
    expect((await message(WAREHOUSE, c.id, { message: 'Hello' })).status).toBe(403);
    const draft = await submittedClaim({ submit: false });
    expect(await message(DEALER, draft.id, { message: 'Hello' })).toMatchObject({ status: 409, body: { error: 'Messages start once the claim is submitted.' } });
    expect((await events(c.id, 'MESSAGE')).length).toBe(0);
    expect((await events(draft.id, 'MESSAGE')).length).toBe(0);
  });
});

describe('notifications of each step that needs the other side', () => {
  it('submitted → reps; more asked → shop; resubmitted → rep; decided → shop; appealed → the other rep; each with a mail', async () => {
    const c = await submittedClaim();
    await take(REP, c.id);
    await step(REP, c.id, { type: 'REQUEST_INFO', version: await versionOf(c.id), items: [{ key: 'proof_of_purchase' }], message: 'Receipt, please.' });
    await step(DEALER, c.id, { type: 'RESUBMIT', version: await versionOf(c.id) });
    await step(REP, c.id, { type: 'DENY', version: await versionOf(c.id), reasonCode: 'unregistered_no_proof', message: 'The receipt is unreadable.' });
    await step(DEALER, c.id, { type: 'APPEAL', version: await versionOf(c.id), message: 'A clearer scan is attached.' });
    const notes = await notesFor(c.id);
    const kinds = (kind: string) => notes.filter((n) => n.kind === kind).map((n) => n.email).sort();
    expect(kinds('claim_submitted')).toEqual([REP2, REP].sort());
    expect(kinds('more_requested')).toEqual([DEALER_ADMIN, DEALER].sort());
    expect(kinds('resubmitted')).toEqual([REP]);
    expect(kinds('denied')).toEqual([DEALER_ADMIN, DEALER].sort());
    expect(kinds('appealed')).toEqual([REP2]);
    // Every notification has its mail, to the same person, linking to the claim.
    const mails = await db()('outbox').where({ claim_id: c.id }).select('to_email', 'subject', 'text_body');
    expect(mails.length).toBe(notes.length);
    expect(mails.every((m) => m.subject.startsWith(`[${c.number}]`) && m.text_body.includes(`/claims/${c.id}`))).toBe(true);
  });

  it('a refused step writes no notification and no mail', async () => {
    const c = await submittedClaim();
    const before = (await notesFor(c.id)).length;
    const outboxBefore = Number((await db()('outbox').where({ claim_id: c.id }).count('id as n').first())!.n);
    expect((await step(REP, c.id, { type: 'DENY', version: await versionOf(c.id), reasonCode: 'wear_item', message: 'x' })).status).toBe(409);
    expect((await step(DEALER, c.id, { type: 'APPEAL', version: await versionOf(c.id), message: 'x' })).status).toBe(409);
    expect((await notesFor(c.id)).length).toBe(before);
    expect(Number((await db()('outbox').where({ claim_id: c.id }).count('id as n').first())!.n)).toBe(outboxBefore);
  });
});

describe('deadline reminders', () => {
  const reminders = async (id: string) => (await notesFor(id)).filter((n) => n.kind.startsWith('review_'));

  it('once per claim and threshold: near, then passed; never twice, even with two runs at once', async () => {
    const c = await submittedClaim();
    await take(REP, c.id);
    const cal = await brandCalendar(c.brandId);
    const today = localDate(new Date().toISOString(), cal.timeZone);
    const soon = addBusinessDays(today, 1, { holidays: cal.holidays });
    await db()('claims').where({ id: c.id }).update({ review_due_on: soon });

    await Promise.all([remindReviewDeadlines(), remindReviewDeadlines()]);
    await remindReviewDeadlines();
    let notes = await reminders(c.id);
    expect(notes.map((n) => [n.kind, n.email])).toEqual([['review_due_soon', REP]]); // the assigned rep
    expect(notes[0]!.title).toContain(soon);

    await db()('claims').where({ id: c.id }).update({ review_due_on: '2026-01-05' });
    await remindReviewDeadlines();
    await remindReviewDeadlines();
    notes = await reminders(c.id);
    expect(notes.map((n) => n.kind)).toEqual(['review_due_soon', 'review_overdue']);
    expect(notes[1]!.title).toBe(`Claim ${c.number} is past its review deadline (Monday 2026-01-05)`);
    expect(notes.every((n) => n.mailTo === REP)).toBe(true);
  });

  it('no reminder while the claim waits on the dealer, or once it is decided', async () => {
    const c = await submittedClaim();
    await take(REP, c.id);
    await step(REP, c.id, { type: 'REQUEST_INFO', version: await versionOf(c.id), items: [{ key: 'diagnostic_log' }], message: 'Log, please.' });
    await db()('claims').where({ id: c.id }).update({ review_due_on: '2026-01-05' }); // even with a due date left behind
    await remindReviewDeadlines();
    expect(await reminders(c.id)).toEqual([]);
  });

  it('while nobody has taken the claim, every rep is reminded', async () => {
    const c = await submittedClaim();
    await db()('claims').where({ id: c.id }).update({ review_due_on: '2026-01-05' });
    await remindReviewDeadlines();
    expect((await reminders(c.id)).map((n) => n.email).sort()).toEqual([REP2, REP].sort());
  });
});
