import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { PATCH as patchClaimRoute } from '@/app/api/claims/[id]/route';
import { POST as stepRoute } from '@/app/api/claims/[id]/steps/route';
import { POST as createClaimRoute } from '@/app/api/claims/route';
import { db } from '@/db/connection';
import { findActiveUser } from '@/lib/db/users';
import { loadClaimView } from '@/lib/services/claim-view';
import { actAs, userId } from '../../support/acting-user';
import { addCompleteEvidence, call, createDraft, orgId, PEOPLE, registerBike, submit, submittedClaim, tag } from './support';

const t = tag();
let torvane: string;
let partId: string;
beforeAll(async () => {
  torvane = await orgId('torvane');
  partId = (await db()('parts').where({ brand_id: torvane, part_number: 'TV-DU85' }).first('id')).id;
});
beforeEach(() => actAs(PEOPLE.dealer));

const viewAs = async (email: string, claimId: string) => loadClaimView((await findActiveUser(await userId(email)))!, claimId);

describe('a sale date after the failure date', () => {
  it('is refused for an unregistered bike, on the sale date, and nothing is filed', async () => {
    const frameSerial = `FR${t}-U1`;
    const r = await call(createClaimRoute, { method: 'POST', body: { brandId: torvane, frameSerial, partId, saleDate: '2026-06-11', failureDate: '2026-06-10' } });
    expect(r.status).toBe(422);
    expect(r.body.fieldErrors).toEqual({ saleDate: ['The sale date is after the failure date.'] });
    expect(await db()('claims').where({ frame_serial: frameSerial }).first()).toBeUndefined();
  });

  it('is refused against the registry’s sale date, naming it, whatever date the dealer typed', async () => {
    const frameSerial = `FR${t}-R1`;
    await registerBike(frameSerial, '2026-06-01');
    const r = await call(createClaimRoute, { method: 'POST', body: { brandId: torvane, frameSerial, partId, saleDate: '2026-01-01', failureDate: '2026-05-20' } });
    expect(r.status).toBe(422);
    expect(r.body.fieldErrors).toEqual({ failureDate: ['The bike was sold on 2026-06-01; the failure date cannot be earlier.'] });
    // The sale day itself is a possible failure day.
    expect((await call(createClaimRoute, { method: 'POST', body: { brandId: torvane, frameSerial, partId, failureDate: '2026-06-01' } })).status).toBe(201);
  });

  it('an edit that would put the sale after the failure is refused and the draft stays as it was', async () => {
    const claim = await createDraft(PEOPLE.dealer, `FR${t}-U2`, { saleDate: '2026-01-15' });
    const before = await db()('claims').where({ id: claim.id }).first();
    const r = await call(patchClaimRoute, { method: 'PATCH', params: { id: claim.id }, body: { version: before.version, brandId: torvane, frameSerial: `FR${t}-U2`, partId, saleDate: '2026-07-01', failureDate: '2026-06-10' } });
    expect(r.status).toBe(422);
    expect(await db()('claims').where({ id: claim.id }).first()).toEqual(before);
  });

  it('the database refuses it too, whatever the code does', async () => {
    const claim = await createDraft(PEOPLE.dealer, `FR${t}-U3`, { saleDate: '2026-01-15' });
    await expect(db()('claims').where({ id: claim.id }).update({ sale_date: '2026-06-11', failure_date: '2026-06-10' })).rejects.toThrow(/claims_sale_before_failure/);
  });

  it('a failure date in the future is refused', async () => {
    const r = await call(createClaimRoute, { method: 'POST', body: { brandId: torvane, frameSerial: `FR${t}-U4`, partId, failureDate: '2099-01-01' } });
    expect(r.body.fieldErrors).toEqual({ failureDate: ['The failure date is in the future.'] });
  });
});

describe('a serial already on an open claim', () => {
  const frame = `OS${t}-1`;
  let first: { id: string; number: string };
  let otherShopClaim: { id: string; number: string };
  beforeAll(async () => {
    first = await submittedClaim(frame);
  });

  it('the same shop is warned with a link to the open claim, on the frame serial and on the part serial', async () => {
    const second = await createDraft(PEOPLE.dealer, frame);
    const view = await viewAs(PEOPLE.dealer, second.id);
    expect(view.warnings).toEqual([{ id: first.id, number: first.number, stage: 'submitted', dealerId: await orgId('kettenblatt'), visible: true }]);

    // Another frame, but the failed part's serial is the one on the open claim.
    await registerBike(`OS${t}-2`);
    const third = await createDraft(PEOPLE.dealer, `OS${t}-2`, { partSerial: `DU85-${frame}` });
    expect((await viewAs(PEOPLE.dealer, third.id)).warnings.map((w) => w.number)).toEqual(expect.arrayContaining([first.number]));
  });

  it('another shop is warned that an open claim exists, without its number or a link', async () => {
    const theirs = await createDraft(PEOPLE.otherShop, frame);
    const view = await viewAs(PEOPLE.otherShop, theirs.id);
    expect(view.warnings).toEqual([{ id: null, number: null, stage: 'submitted', dealerId: null, visible: false }]);
    expect(JSON.stringify(view.warnings)).not.toContain(first.number);
    await addCompleteEvidence(theirs.id);
    expect((await submit(theirs.id)).status).toBe(200);
    otherShopClaim = theirs;
  });

  it('the brand’s rep sees every submitted claim on the serial with its link, and no shop’s draft', async () => {
    const view = await viewAs(PEOPLE.rep, first.id);
    expect(view.warnings).toEqual([{ id: otherShopClaim.id, number: otherShopClaim.number, stage: 'submitted', dealerId: await orgId('lanternhill'), visible: true }]);
  });

  it('a withdrawn claim no longer warns', async () => {
    await registerBike(`OS${t}-3`);
    const old = await createDraft(PEOPLE.dealer, `OS${t}-3`);
    expect((await call(stepRoute, { method: 'POST', params: { id: old.id }, body: { type: 'WITHDRAW' } })).status).toBe(200);
    const fresh = await createDraft(PEOPLE.dealer, `OS${t}-3`);
    expect((await viewAs(PEOPLE.dealer, fresh.id)).warnings).toEqual([]);
  });
});
