import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { addBusinessDays, localDate } from '@/lib/calendar';
import { brandCalendar, clockEventsFor } from '@/lib/db/review';
import { reviewDeadline } from '@/lib/review';
import { claimRow, DEALER, FOREIGN_REP, orgId, OTHER_DEALER, queue, REP, REP2, step, submittedClaim, take, versionOf, WAREHOUSE } from './support';

const ids = (body: Record<string, any>) => (body.rows as { id: string }[]).map((r) => r.id);

/** Every row of a filtered queue, page by page (the suite's database holds many claims). */
async function allRows(email: string, params: Record<string, string>) {
  const rows: Record<string, any>[] = [];
  for (let page = 1; ; page++) {
    const r = await queue(email, { ...params, pageSize: '100', page: String(page) });
    rows.push(...r.body.rows);
    if (rows.length >= r.body.total || !r.body.rows.length) return rows;
  }
}

describe('the review queue route', () => {
  it('is for brand reps only (403), and shows a rep only their own brand’s claims', async () => {
    const c = await submittedClaim();
    expect((await queue(DEALER)).status).toBe(403);
    expect((await queue(WAREHOUSE)).status).toBe(403);
    const foreign = await queue(FOREIGN_REP, { view: 'all', pageSize: '100', q: c.number });
    expect(foreign).toMatchObject({ status: 200, body: { total: 0 } });
    const own = await queue(REP, { q: c.number });
    expect(own.body.total).toBe(1);
    expect(own.body.rule).toMatch(/ISDA 'Following'/);
    const [row] = own.body.rows;
    expect(row).toMatchObject({ id: c.id, stage: 'submitted', dealerName: 'Kettenblatt Radwerk', partNumber: 'TV-DU85', canTake: true, canRelease: false });
    // The row's clock agrees with the stored due date, computed the same way.
    const stored = await claimRow(c.id);
    expect(row.clock.dueDate).toBe(stored.review_due_on);
    const cal = await brandCalendar(c.brandId);
    const expected = reviewDeadline({
      startedAt: new Date(stored.review_started_at).toISOString(), now: new Date().toISOString(), timeZone: cal.timeZone,
      calendar: { holidays: cal.holidays }, reviewDays: 5, events: (await clockEventsFor([c.id])).get(c.id) ?? [],
    });
    expect(row.clock.businessDaysLeft).toBe(expected.businessDaysLeft);
  });

  it('never lists another brand’s or a draft claim, whatever the filters', async () => {
    const draft = await submittedClaim({ submit: false });
    const r = await queue(REP, { view: 'all', q: draft.number });
    expect(r.body.total).toBe(0);
  });

  it('filters by state, assignment, dealer, part category, age and deadline', async () => {
    const a = await submittedClaim();
    const b = await submittedClaim({ dealer: OTHER_DEALER, frameSerial: 'KU25-007740' });
    await take(REP, b.id);
    const q = async (p: Record<string, string>) => ({ body: { rows: await allRows(REP, p) } });

    expect(ids((await q({ view: 'needs_rep' })).body)).toContain(a.id);
    expect(ids((await q({ view: 'needs_rep' })).body)).not.toContain(b.id);
    expect(ids((await q({ view: 'in_review', assigned: 'me' })).body)).toContain(b.id);
    expect((await allRows(REP2, { view: 'in_review', assigned: 'me' })).map((r) => r.id)).not.toContain(b.id);
    expect(ids((await q({ assigned: 'nobody' })).body)).not.toContain(b.id);

    const lanternhill = await orgId('lanternhill');
    const byDealer = await q({ dealer: lanternhill });
    expect(ids(byDealer.body)).toContain(b.id);
    expect(ids(byDealer.body)).not.toContain(a.id);
    expect(byDealer.body.rows.every((r) => r.dealerId === lanternhill)).toBe(true);
    expect((await queue(REP, { category: 'battery', q: a.number })).body.total).toBe(0);
    expect((await queue(REP, { category: 'drive_unit', q: a.number })).body.total).toBe(1);

    // Age: as if submitted ten days ago.
    await db()('claims').where({ id: a.id }).update({ submitted_at: db().raw(`now() - interval '10 days'`) });
    expect(ids((await q({ age: '8-30' })).body)).toContain(a.id);
    expect(ids((await q({ age: '0-2' })).body)).not.toContain(a.id);

    // Deadline: a due date in the past stands out as overdue; one far ahead is on track.
    const cal = await brandCalendar(a.brandId);
    const today = localDate(new Date().toISOString(), cal.timeZone);
    await db()('claims').where({ id: a.id }).update({ review_due_on: '2026-01-05' });
    await db()('claims').where({ id: b.id }).update({ review_due_on: addBusinessDays(today, 15, { holidays: cal.holidays }) });
    const overdue = await q({ deadline: 'overdue' });
    expect(ids(overdue.body)).toContain(a.id);
    expect(ids(overdue.body)).not.toContain(b.id);
    expect(ids((await q({ deadline: 'on_track' })).body)).toContain(b.id);
    expect(ids((await q({ deadline: 'due_soon' })).body)).not.toContain(a.id);
  });

  it('sorts by deadline, soonest first, claims waiting on the dealer (no running clock) last', async () => {
    const a = await submittedClaim();
    const b = await submittedClaim();
    const c = await submittedClaim();
    await db()('claims').where({ id: a.id }).update({ review_due_on: '2026-02-03' });
    await db()('claims').where({ id: b.id }).update({ review_due_on: '2026-02-02' });
    await take(REP, c.id);
    await step(REP, c.id, { type: 'REQUEST_INFO', version: await versionOf(c.id), items: [{ key: 'diagnostic_log' }], message: 'Please add the log.' });
    const rows = await allRows(REP, {});
    const order = rows.map((r) => r.id as string);
    expect(order.indexOf(b.id)).toBeGreaterThanOrEqual(0);
    expect(order.indexOf(b.id)).toBeLessThan(order.indexOf(a.id));
    expect(order.indexOf(a.id)).toBeLessThan(order.indexOf(c.id));
    const dues = rows.map((r) => r.reviewDueOn as string | null);
    const firstNull = dues.indexOf(null);
    expect(dues.slice(0, firstNull < 0 ? dues.length : firstNull)).toEqual([...dues.slice(0, firstNull < 0 ? dues.length : firstNull)].sort());
    expect(dues.slice(firstNull).every((d) => d === null)).toBe(true);
    const waiting = rows.find((x) => x.id === c.id)!;
    expect(waiting.reviewDueOn).toBeNull();
    expect(waiting.clock).toMatchObject({ status: 'paused', isPaused: true });
    const desc = (await allRows(REP, { sort: 'deadline', dir: 'desc' })).map((r) => r.id as string);
    expect(desc.indexOf(a.id)).toBeLessThan(desc.indexOf(b.id));
  });

  it('pages: page 2 follows page 1 with no overlap, and the total is the filtered count', async () => {
    for (let i = 0; i < 3; i++) await submittedClaim();
    const p1 = await queue(REP, { pageSize: '2', page: '1', sort: 'number' });
    const p2 = await queue(REP, { pageSize: '2', page: '2', sort: 'number' });
    expect(p1.body.rows).toHaveLength(2);
    expect(p2.body.total).toBe(p1.body.total);
    expect(ids(p1.body).filter((id) => ids(p2.body).includes(id))).toEqual([]);
    expect(p1.body.rows[1].number < p2.body.rows[0].number).toBe(true);
  });

  it('refuses a malformed query with 422 and field messages', async () => {
    const r = await queue(REP, { sort: 'price', pageSize: '1000', dealer: 'abc' });
    expect(r.status).toBe(422);
    expect(Object.keys(r.body.fieldErrors).sort()).toEqual(['dealer', 'pageSize', 'sort']);
  });
});
