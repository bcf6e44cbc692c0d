// A shop that fitted the replacement from its own shelf: approval ships nothing, the warehouse's
// to-ship list leaves the claim out, and the dealer goes straight to the after-test.
import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { findActiveUser } from '@/lib/db/users';
import { toShipPage } from '@/lib/services/warehouse';
import { toShipQuerySchema } from '@/lib/validation/fulfilment';
import { actAs } from '../../support/acting-user';
import { claimRow, DEALER, fullApproval, REP, step, submittedClaim, take, versionOf, WAREHOUSE } from './support';

async function approvedFromStock() {
  const c = await submittedClaim({ fromDealerStock: true });
  expect((await take(REP, c.id)).status).toBe(200);
  const r = await step(REP, c.id, { type: 'APPROVE', version: await versionOf(c.id), ...(await fullApproval(c.id)) });
  expect(r.status).toBe(200);
  return c;
}

describe('approved with every part from the dealer’s stock', () => {
  it('goes to the after-test, not to the warehouse; the dealer is told nothing ships', async () => {
    const c = await approvedFromStock();
    const row = await claimRow(c.id);
    expect(row.replacement_step).toBe('from_shop_stock');
    expect(row.core_step).toBe('requested');
    expect(row.context.replacement.fromShopStock).toBe(true);
    const approved = await db()('notifications').where({ claim_id: c.id, kind: 'approved' }).first('body');
    expect(approved.body).toContain('Nothing ships: you fitted the approved parts from your own stock.');

    // Found by its RMA number, a claim whose part ships is listed; this one is not.
    const shipping = await submittedClaim();
    expect((await take(REP, shipping.id)).status).toBe(200);
    expect((await step(REP, shipping.id, { type: 'APPROVE', version: await versionOf(shipping.id), ...(await fullApproval(shipping.id)) })).status).toBe(200);
    const warehouse = (await findActiveUser((await actAs(WAREHOUSE))!))!;
    const listed = async (rma: string) => (await toShipPage(warehouse, toShipQuerySchema.parse({ q: rma }))).rows.map((r) => r.id);
    expect(await listed((await claimRow(shipping.id)).rma_number)).toContain(shipping.id);
    expect(await listed(row.rma_number)).not.toContain(c.id);
  });

  it('a shipment is refused with the reason and changes nothing', async () => {
    const c = await approvedFromStock();
    const before = await claimRow(c.id);
    const r = await step(WAREHOUSE, c.id, { type: 'SHIP', version: before.version, carrier: 'ferrule', service: 'road', tracking: 'book', pickedLineIds: ['p1'] });
    expect(r.status).toBe(409);
    expect(JSON.stringify(r.body)).toContain('nothing to ship');
    const after = await claimRow(c.id);
    expect(after.version).toBe(before.version);
    expect(after.replacement_step).toBe('from_shop_stock');
  });

  it('the dealer may mark it fitted with an after-test straight away', async () => {
    const c = await approvedFromStock();
    const r = await step(DEALER, c.id, { type: 'MARK_FITTED', version: await versionOf(c.id), afterTestId: '00000000-0000-4000-8000-000000000000' });
    // The step is open (no 409 for the state); the unknown run is the only thing wrong with it.
    expect(r.status).toBe(422);
    expect(JSON.stringify(r.body)).toContain('after-test');
  });
});
