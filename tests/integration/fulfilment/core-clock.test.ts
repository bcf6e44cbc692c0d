import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { POST as stepsPOST } from '@/app/api/claims/[id]/steps/route';
import { db } from '@/db/connection';
import { addBusinessDays, localDate } from '@/lib/calendar';
import { findActiveUser } from '@/lib/db/users';
import { runCoreClock } from '@/lib/services/tracking';
import { returnsPage } from '@/lib/services/warehouse';
import { returnsQuerySchema } from '@/lib/validation/fulfilment';
import { actAs } from '../../support/acting-user';
import { approvedClaim, setStock } from '../../support/approved-claims';
import { ensureCarrier, stopCarrier } from '../../support/carrier';
import { call } from '../../support/route';

beforeAll(ensureCarrier);
afterAll(stopCarrier);

const TZ = 'Europe/Amsterdam';

/** A Torvane controller claim shipped and (as far as the database knows) delivered on a chosen brand-local day. */
async function deliveredOn(day: string) {
  const claim = await approvedClaim({ failedPart: 'TV-CT20' });
  await setStock('torvane', 'TV-CT20', 10);
  await actAs('felix.moreau@torvane.test');
  const res = await call(stepsPOST, { id: claim.id }, { body: { type: 'SHIP', version: 3, carrier: 'ferrule', service: 'road', tracking: 'book', pickedLineIds: ['p1'] } });
  expect(res.status, JSON.stringify(res.data)).toBe(200);
  // Noon in Amsterdam on that day: the carrier's delivery scan, as the poller would have stored it.
  await db()('shipments').where({ claim_id: claim.id, direction: 'outbound' }).update({ tracking_status: 'delivered', delivered_at: `${day}T11:00:00Z` });
  return claim;
}

async function holidays(): Promise<string[]> {
  return (await db()('brand_holidays as h').join('organisations as o', 'o.id', 'h.brand_id').where('o.slug', 'torvane').select('h.day')).map((r) => r.day);
}

const core = async (id: string) => (await db()('claims').where({ id }).first('core_step', 'context')) as { core_step: string; context: { core: { remindersSent: number; lastReminderAt: string | null }; chargebackReasons: string[] } };

describe('the core-return clock (business days from delivery; Torvane controller policy: 15 days, 5 days of grace)', () => {
  it('inside the return period nothing happens; the due date is stored for the queue', async () => {
    const today = localDate(new Date().toISOString(), TZ);
    const h = await holidays();
    const delivered = addBusinessDays(today, -3, { holidays: h });
    const claim = await deliveredOn(delivered);
    await runCoreClock();
    expect((await core(claim.id)).context.core.remindersSent).toBe(0);
    const parcel = await db()('shipments').where({ claim_id: claim.id, direction: 'outbound' }).first('core_due_on');
    expect(parcel.core_due_on).toBe(addBusinessDays(delivered, 15, { holidays: h }));
  });

  it('overdue within grace: one reminder through the outbox, not two', async () => {
    const today = localDate(new Date().toISOString(), TZ);
    const h = await holidays();
    // Delivered 17 business days ago: due 2 business days ago, grace runs 3 more.
    const claim = await deliveredOn(addBusinessDays(today, -17, { holidays: h }));
    await runCoreClock();
    let c = await core(claim.id);
    expect(c.core_step).toBe('requested');
    expect(c.context.core.remindersSent).toBe(1);
    const mail = await db()('outbox').where({ claim_id: claim.id, to_email: 'lena.hartmann@kettenblatt.test' }).orderBy('id', 'desc').first();
    expect(mail.subject).toMatch(/is overdue/);
    await runCoreClock();
    c = await core(claim.id);
    expect(c.context.core.remindersSent).toBe(1);
    // Even a reminder from days ago does not write it off before grace has ended.
    await db()('claims').where({ id: claim.id }).update({ context: db().raw(`jsonb_set(context, '{core,lastReminderAt}', to_jsonb(?::text))`, [new Date(Date.now() - 3 * 86_400_000).toISOString()]) });
    await runCoreClock();
    expect((await core(claim.id)).core_step).toBe('requested');
  });

  it('after grace: written off (core not returned → chargeback), dealer, accounts and warehouse told', async () => {
    const today = localDate(new Date().toISOString(), TZ);
    const h = await holidays();
    // Delivered 21 business days ago: 15 + 5 of grace have passed.
    const claim = await deliveredOn(addBusinessDays(today, -21, { holidays: h }));
    await runCoreClock();
    let c = await core(claim.id);
    // The first run only reminds: a core is never written off without a reminder on an earlier day.
    expect(c.core_step).toBe('requested');
    expect(c.context.core.remindersSent).toBe(1);
    await runCoreClock();
    expect((await core(claim.id)).core_step).toBe('requested');

    await db()('claims').where({ id: claim.id }).update({ context: db().raw(`jsonb_set(context, '{core,lastReminderAt}', to_jsonb(?::text))`, [new Date(Date.now() - 2 * 86_400_000).toISOString()]) });
    await runCoreClock();
    c = await core(claim.id);
    expect(c.core_step).toBe('written_off');
    expect(c.context.chargebackReasons).toEqual(['core_not_returned']);
    const event = await db()('claim_events').where({ claim_id: claim.id, event: 'WRITE_OFF_CORE' }).first();
    expect(event).toMatchObject({ actor_role: 'system', actor_id: null });
    const to = (await db()('outbox').where({ claim_id: claim.id }).where('subject', 'like', '%written off%')).map((m) => m.to_email);
    expect(to).toEqual(expect.arrayContaining(['lena.hartmann@kettenblatt.test', 'hana.sato@torvane.test', 'felix.moreau@torvane.test']));
  });

  it('with nothing shipped (the shop fitted its own part), the clock runs from the approval', async () => {
    const h = await holidays();
    const today = localDate(new Date().toISOString(), TZ);
    // Approved 17 business days ago, at noon in Amsterdam: due 2 business days ago, still in grace.
    const approvedOn = addBusinessDays(today, -17, { holidays: h });
    const claim = await approvedClaim({ failedPart: 'TV-CT20', lines: [{ part: 'TV-CT20', fromDealerStock: true }], approvedAt: new Date(`${approvedOn}T11:00:00Z`) });
    const row = await db()('claims').where({ id: claim.id }).first('replacement_step');
    expect(row.replacement_step).toBe('from_shop_stock');
    await runCoreClock();
    const c = await core(claim.id);
    expect(c.core_step).toBe('requested');
    expect(c.context.core.remindersSent).toBe(1);
    // The warehouse's returns queue shows the due day and lists it as overdue.
    const due = addBusinessDays(approvedOn, 15, { holidays: h });
    expect((await db()('claims').where({ id: claim.id }).first('core_due_on')).core_due_on).toBe(due);
    const warehouse = (await findActiveUser((await actAs('felix.moreau@torvane.test'))!))!;
    const page = await returnsPage(warehouse, returnsQuerySchema.parse({ filter: 'overdue', q: claim.rmaNumber! }));
    expect(page.rows.map((r) => [r.id, r.coreDueOn, r.nothingShips])).toEqual([[claim.id, due, true]]);
  });
});
