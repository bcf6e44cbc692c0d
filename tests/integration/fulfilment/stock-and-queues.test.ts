import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { POST as stepsPOST } from '@/app/api/claims/[id]/steps/route';
import { GET as returnsGET } from '@/app/api/warehouse/returns/route';
import { PUT as restockPUT, POST as adjustPOST } from '@/app/api/warehouse/stock/[partId]/route';
import { GET as toShipGET } from '@/app/api/warehouse/to-ship/route';
import { db } from '@/db/connection';
import { actAs } from '../../support/acting-user';
import { approvedClaim, onHand, setStock } from '../../support/approved-claims';
import { ensureCarrier, stopCarrier } from '../../support/carrier';
import { call } from '../../support/route';

beforeAll(ensureCarrier);
afterAll(stopCarrier);

const WAREHOUSE = 'felix.moreau@torvane.test';
const adjust = (partId: string, body: unknown) => call(adjustPOST, { partId }, { body });
const movements = (partId: string) => db()('stock_movements').where({ part_id: partId }).orderBy('id');

describe('stock adjustments', () => {
  it('adds a delivery and removes damaged stock, each with its reason in the log', async () => {
    const partId = await setStock('torvane', 'TV-DPC2', 2);
    await actAs(WAREHOUSE);
    const before = (await movements(partId)).length;
    const add = await adjust(partId, { delta: 5, reason: 'delivery_received', note: 'Batch 26-48' });
    expect(add.status, JSON.stringify(add.data)).toBe(200);
    expect(add.data).toMatchObject({ onHand: 7 });
    const remove = await adjust(partId, { delta: -1, reason: 'damaged_in_store', note: 'Screen cracked on the shelf' });
    expect(remove.data).toMatchObject({ onHand: 6 });
    const log = (await movements(partId)).slice(before);
    expect(log.map((m) => [m.kind, m.delta, m.on_hand_after, m.reason])).toEqual([
      ['adjustment', 5, 7, 'delivery_received'],
      ['adjustment', -1, 6, 'damaged_in_store'],
    ]);
    // The log is append-only.
    await expect(db()('stock_movements').where({ id: log[0]!.id }).update({ delta: 50 })).rejects.toThrow(/append-only/);
  });

  it('a delivery booked twice (a retry, a second tab) counts once when the level the user saw is sent', async () => {
    const partId = await setStock('torvane', 'TV-DPC2', 3);
    await actAs(WAREHOUSE);
    const body = { delta: 4, reason: 'delivery_received', note: 'Batch 26-51', expectedOnHand: 3 };
    const [a, b] = await Promise.all([adjust(partId, body), adjust(partId, body)]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect(await onHand(partId)).toBe(7);
    const again = await adjust(partId, body);
    expect(again.status).toBe(409);
    expect(JSON.stringify(again.data)).toMatch(/now shows 7 on hand, not 3/);
    expect(await onHand(partId)).toBe(7);
  });

  it('refuses what makes no sense, and leaves the level as it was', async () => {
    const partId = await setStock('torvane', 'TV-DPC2', 1);
    await actAs(WAREHOUSE);
    const before = (await movements(partId)).length;
    const tooMany = await adjust(partId, { delta: -2, reason: 'count_correction' });
    expect(tooMany.status).toBe(409);
    expect(tooMany.data.error).toMatch(/Only 1 of TV-DPC2 on hand; removing 2 would go below zero/);
    expect((await adjust(partId, { delta: -1, reason: 'delivery_received' })).status).toBe(422);
    expect((await adjust(partId, { delta: 3, reason: 'damaged_in_store' })).status).toBe(422);
    expect((await adjust(partId, { delta: 1, reason: 'other', note: '  ' })).data.error).toMatch(/Say in the note why/);
    expect((await adjust(partId, { delta: 0, reason: 'count_correction' })).status).toBe(422);
    expect((await adjust(partId, { delta: 'lots', reason: 'count_correction' })).status).toBe(422);
    expect((await adjust(partId, { delta: 1, reason: 'found_it' })).status).toBe(422);
    expect(await onHand(partId)).toBe(1);
    expect(await movements(partId)).toHaveLength(before);
  });

  it('another brand’s part is not found; other roles may not adjust', async () => {
    const wrenfieldPart = await setStock('wrenfield', 'WF-LCD3', 3);
    await actAs(WAREHOUSE);
    expect((await adjust(wrenfieldPart, { delta: 1, reason: 'count_correction' })).status).toBe(404);
    await actAs('priya.nair@torvane.test');
    const partId = await setStock('torvane', 'TV-DPC2', 1);
    expect((await adjust(partId, { delta: 1, reason: 'count_correction' })).status).toBe(403);
    await actAs('lena.hartmann@kettenblatt.test');
    expect((await adjust(partId, { delta: 1, reason: 'count_correction' })).status).toBe(403);
    expect(await onHand(wrenfieldPart)).toBe(3);
  });

  it('sets the date more is expected, logged; a bad date is refused', async () => {
    const partId = await setStock('torvane', 'TV-CT20', 0);
    await actAs(WAREHOUSE);
    expect((await call(restockPUT, { partId }, { method: 'PUT', body: { expectedOn: '2027-31-02' } })).status).toBe(422);
    const ok = await call(restockPUT, { partId }, { method: 'PUT', body: { expectedOn: '2027-03-02', note: 'Factory confirmed' } });
    expect(ok.status).toBe(200);
    expect((await db()('stock_levels').where({ part_id: partId }).first()).restock_expected_on).toBe('2027-03-02');
    expect((await movements(partId)).at(-1)).toMatchObject({ kind: 'expected_date', delta: 0, expected_on: '2027-03-02', note: 'Factory confirmed' });
  });
});

describe('the queues', () => {
  it('to ship: only the brand’s approved claims, paged on the server, back-orders flagged with their date', async () => {
    await setStock('torvane', 'TV-DU85', 0, '2027-02-01');
    const short = await approvedClaim({ failedPart: 'TV-DU85' });
    await setStock('torvane', 'TV-BP500', 9);
    const ready = await approvedClaim({ failedPart: 'TV-BP500' });
    const other = await approvedClaim({ brand: 'wrenfield', failedPart: 'WF-LCD3', dealer: 'lanternhill', filedBy: 'sam.okafor@lanternhill.test' });
    await actAs(WAREHOUSE);

    const back = await call(toShipGET, {}, { path: `/api/warehouse/to-ship?filter=backordered&q=${short.rmaNumber}` });
    expect(back.status).toBe(200);
    expect(back.data.total).toBe(1);
    expect(back.data.rows[0]).toMatchObject({ id: short.id, backordered: true, availability: [{ partNumber: 'TV-DU85', inStock: false, expectedOn: '2027-02-01' }] });

    const batteries = await call(toShipGET, {}, { path: `/api/warehouse/to-ship?filter=batteries&q=${ready.rmaNumber}` });
    expect(batteries.data.rows.map((r: { id: string }) => r.id)).toEqual([ready.id]);
    expect(batteries.data.rows[0]).toMatchObject({ hasBattery: true, backordered: false });

    const page1 = await call(toShipGET, {}, { path: '/api/warehouse/to-ship?pageSize=1&page=1' });
    const page2 = await call(toShipGET, {}, { path: '/api/warehouse/to-ship?pageSize=1&page=2' });
    expect(page1.data.total).toBeGreaterThanOrEqual(2);
    expect(page1.data.rows).toHaveLength(1);
    expect(page1.data.rows[0].id).not.toBe(page2.data.rows[0].id);

    // Numbers run per brand, so another brand may have the same RMA number: the other claim itself never shows.
    const foreign = await call(toShipGET, {}, { path: `/api/warehouse/to-ship?pageSize=100&q=${other.rmaNumber}` });
    expect(foreign.data.rows.map((r: { id: string }) => r.id)).not.toContain(other.id);
    await actAs('tom.reyes@wrenfield.test');
    const own = await call(toShipGET, {}, { path: `/api/warehouse/to-ship?pageSize=100&q=${other.rmaNumber}` });
    expect(own.data.rows.map((r: { id: string }) => r.id)).toContain(other.id);
    expect(own.data.rows.map((r: { id: string }) => r.id)).not.toContain(short.id);
    expect((await call(toShipGET, {}, { path: '/api/warehouse/to-ship?pageSize=1000' })).status).toBe(422);
    await actAs('lena.hartmann@kettenblatt.test');
    expect((await call(toShipGET, {}, { path: '/api/warehouse/to-ship' })).status).toBe(403);
  });

  it('returns: a label needed, then awaiting the dealer once it is issued', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-DU60' });
    await actAs(WAREHOUSE);
    const needed = await call(returnsGET, {}, { path: `/api/warehouse/returns?filter=label_needed&q=${claim.rmaNumber}` });
    expect(needed.data.rows.map((r: { id: string }) => r.id)).toEqual([claim.id]);
    const res = await call(stepsPOST, { id: claim.id }, { body: { type: 'ISSUE_RETURN_LABEL', version: 3, carrier: 'ferrule', service: 'road' } });
    expect(res.status).toBe(200);
    expect((await call(returnsGET, {}, { path: `/api/warehouse/returns?filter=label_needed&q=${claim.rmaNumber}` })).data.total).toBe(0);
    const awaiting = await call(returnsGET, {}, { path: `/api/warehouse/returns?filter=awaiting_dealer&q=${claim.rmaNumber}` });
    expect(awaiting.data.rows[0]).toMatchObject({ id: claim.id, coreStep: 'requested', labelCarrier: 'ferrule' });
  });
});
