import { beforeAll, describe, expect, it } from 'vitest';
import { GET as attachmentRoute } from '@/app/api/attachments/[id]/route';
import { DELETE as deleteAttachmentRoute } from '@/app/api/claims/[id]/attachments/[attachmentId]/route';
import { GET as getClaimRoute, PATCH as patchClaimRoute } from '@/app/api/claims/[id]/route';
import { POST as stepRoute } from '@/app/api/claims/[id]/steps/route';
import { POST as completeUploadRoute } from '@/app/api/claims/[id]/uploads/[intentId]/route';
import { POST as requestUploadRoute } from '@/app/api/claims/[id]/uploads/route';
import { GET as listClaimsRoute, POST as createClaimRoute } from '@/app/api/claims/route';
import { GET as lookupRoute } from '@/app/api/registry/lookup/route';
import { db } from '@/db/connection';
import { labelPhoto } from '../../support/evidence-files';
import { actAs } from '../../support/acting-user';
import { addCompleteEvidence, call, createDraft, orgId, PEOPLE, registerBike, sha256, submit, tag, upload } from './support';

// One submitted claim (the brand may see it) and one draft (only its shop may), both filed by
// Kettenblatt against Torvane. Lanternhill's dealer and Wrenfield's rep are the outsiders.
const t = tag();
const submittedFrame = `TI${t}-S`;
const draftFrame = `TI${t}-D`;
let submitted: { id: string; number: string };
let draft: { id: string; number: string };
let attachmentId: string;
let draftAttachmentId: string;
let intentOfDealer: string;
let torvane: string;

const snapshot = async () => ({
  claims: await db()('claims').whereIn('id', [submitted.id, draft.id]).orderBy('id').select('id', 'version', 'state_value', 'updated_at', 'frame_serial', 'symptom'),
  events: Number((await db()('claim_events').whereIn('claim_id', [submitted.id, draft.id]).count('id as n').first())!.n),
  attachments: Number((await db()('attachments').whereIn('claim_id', [submitted.id, draft.id]).count('id as n').first())!.n),
  intents: Number((await db()('upload_intents').whereIn('claim_id', [submitted.id, draft.id]).count('id as n').first())!.n),
});

beforeAll(async () => {
  torvane = await orgId('torvane');
  await registerBike(submittedFrame);
  await registerBike(draftFrame);
  submitted = await createDraft(PEOPLE.dealer, submittedFrame);
  await addCompleteEvidence(submitted.id);
  expect((await submit(submitted.id)).status).toBe(200);
  draft = await createDraft(PEOPLE.dealer, draftFrame);
  const r = await upload(draft.id, { kind: 'photo', fileName: 'draft.jpg', bytes: await labelPhoto('draft') });
  draftAttachmentId = r.complete!.body.id;
  attachmentId = (await db()('attachments').where({ claim_id: submitted.id }).first('id')).id;
  // An upload ticket the shop asked for and has not completed yet.
  const bytes = await labelPhoto('pending');
  const ticket = await call(requestUploadRoute, {
    method: 'POST', path: `/api/claims/${draft.id}/uploads`, params: { id: draft.id },
    body: { kind: 'photo', fileName: 'pending.jpg', size: bytes.length, sha256: sha256(bytes) },
  });
  intentOfDealer = ticket.body.intentId;
});

/** Every claim route, called by `email` on the claim `id`. */
async function everyRoute(email: string, id: string, attachment: string) {
  await actAs(email);
  const p = { id };
  return {
    get: await call(getClaimRoute, { path: `/api/claims/${id}`, params: p }),
    patch: await call(patchClaimRoute, { method: 'PATCH', path: `/api/claims/${id}`, params: p, body: { version: 1, brandId: torvane, frameSerial: 'HIJACKED-1', symptom: 'changed' } }),
    step: await call(stepRoute, { method: 'POST', path: `/api/claims/${id}/steps`, params: p, body: { type: 'WITHDRAW' } }),
    takeStep: await call(stepRoute, { method: 'POST', path: `/api/claims/${id}/steps`, params: p, body: { type: 'SUBMIT' } }),
    repStep: await call(stepRoute, { method: 'POST', path: `/api/claims/${id}/steps`, params: p, body: { type: 'TAKE' } }),
    upload: await call(requestUploadRoute, { method: 'POST', path: `/api/claims/${id}/uploads`, params: p, body: { kind: 'photo', fileName: 'x.jpg', size: 10, sha256: 'a'.repeat(64) } }),
    complete: await call(completeUploadRoute, { method: 'POST', path: `/api/claims/${id}/uploads/${intentOfDealer}`, params: { id, intentId: intentOfDealer } }),
    deleteAttachment: await call(deleteAttachmentRoute, { method: 'DELETE', path: `/api/claims/${id}/attachments/${attachment}`, params: { id, attachmentId: attachment } }),
    attachment: await call(attachmentRoute, { path: `/api/attachments/${attachment}`, params: { id: attachment } }),
  };
}

const statuses = (r: Record<string, { status: number }>) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k, v.status]));

describe('tenant isolation on every claim route', () => {
  it('a dealer of another shop gets 404 from every route, on a submitted claim and on a draft, and nothing changes', async () => {
    const before = await snapshot();
    for (const [id, att] of [[submitted.id, attachmentId], [draft.id, draftAttachmentId]] as const) {
      const r = await everyRoute(PEOPLE.otherShop, id, att);
      expect(statuses(r)).toEqual({ get: 404, patch: 404, step: 404, takeStep: 404, repStep: 403, upload: 404, complete: 404, deleteAttachment: 404, attachment: 404 });
      expect(JSON.stringify(r)).not.toContain(submittedFrame);
    }
    expect(await snapshot()).toEqual(before);
  });

  it('a rep of another brand gets 404 wherever a rep may go, and 403 on the dealer-only routes, and nothing changes', async () => {
    const before = await snapshot();
    for (const [id, att] of [[submitted.id, attachmentId], [draft.id, draftAttachmentId]] as const) {
      const r = await everyRoute(PEOPLE.otherBrandRep, id, att);
      // PATCH, attachment DELETE and dealer-only steps (WITHDRAW, SUBMIT) refuse the role before looking at any id,
      // so the answer is the same whether or not the claim exists.
      expect(statuses(r)).toEqual({ get: 404, patch: 403, step: 403, takeStep: 403, repStep: 404, upload: 404, complete: 404, deleteAttachment: 403, attachment: 404 });
      expect(JSON.stringify(r)).not.toContain(submittedFrame);
    }
    expect(await snapshot()).toEqual(before);
  });

  it('the brand’s own rep sees the submitted claim and its evidence, but not the shop’s draft', async () => {
    await actAs(PEOPLE.rep);
    expect((await call(getClaimRoute, { params: { id: submitted.id } })).body).toMatchObject({ number: submitted.number, frameSerial: submittedFrame });
    expect((await call(attachmentRoute, { params: { id: attachmentId } })).status).toBe(302);
    expect((await call(getClaimRoute, { params: { id: draft.id } })).status).toBe(404);
    expect((await call(attachmentRoute, { params: { id: draftAttachmentId } })).status).toBe(404);
  });

  it('the claims list shows a party only its own claims', async () => {
    const listed = async (email: string) => {
      await actAs(email);
      const r = await call(listClaimsRoute, { path: `/api/claims?q=TI${t}&pageSize=100` });
      expect(r.status).toBe(200);
      return r.body.rows.map((x: { number: string }) => x.number).sort();
    };
    expect(await listed(PEOPLE.dealer)).toEqual([submitted.number, draft.number].sort());
    expect(await listed(PEOPLE.dealerAdmin)).toEqual([submitted.number, draft.number].sort());
    expect(await listed(PEOPLE.rep)).toEqual([submitted.number]);
    expect(await listed(PEOPLE.otherShop)).toEqual([]);
    expect(await listed(PEOPLE.otherBrandRep)).toEqual([]);
    await actAs(null);
    expect((await call(listClaimsRoute, { path: '/api/claims' })).status).toBe(401);
  });

  it('filing is for dealers only, and only with a brand the shop has an account with', async () => {
    const part = await db()('parts').where({ brand_id: torvane, part_number: 'TV-DU85' }).first('id');
    const body = { brandId: torvane, frameSerial: `TI${t}-NEW`, partId: part.id };
    await actAs(PEOPLE.rep);
    expect((await call(createClaimRoute, { method: 'POST', body })).status).toBe(403);
    await actAs(PEOPLE.otherShop);
    const dealerOrg = await orgId('kettenblatt');
    const wrong = await call(createClaimRoute, { method: 'POST', body: { ...body, brandId: dealerOrg } });
    expect(wrong.status).toBe(422);
    expect(wrong.body.fieldErrors.brandId).toEqual(['Choose one of the brands your shop sells.']);
    // Another brand's part id on a Torvane claim is refused too.
    const wrenfieldPart = await db()('parts').where({ brand_id: await orgId('wrenfield') }).first('id');
    expect((await call(createClaimRoute, { method: 'POST', body: { ...body, partId: wrenfieldPart.id } })).body.fieldErrors).toEqual({ partId: ['Choose a part of this brand.'] });
    expect(await db()('claims').where({ frame_serial: `TI${t}-NEW` }).first()).toBeUndefined();
  });

  it('the registry lookup: a shop sees another shop’s open claim on the serial only as a count, never its number', async () => {
    await actAs(PEOPLE.otherShop);
    const other = await call(lookupRoute, { path: `/api/registry/lookup?brand=${torvane}&serial=${submittedFrame}` });
    expect(other.status).toBe(200);
    expect(other.body.openClaims).toEqual([{ id: null, number: null, stage: 'submitted', ours: false }]);
    expect(JSON.stringify(other.body)).not.toContain(submitted.number);
    await actAs(PEOPLE.dealer);
    const own = await call(lookupRoute, { path: `/api/registry/lookup?brand=${torvane}&serial=${submittedFrame.toLowerCase()}` });
    expect(own.body.openClaims).toEqual(expect.arrayContaining([{ id: submitted.id, number: submitted.number, stage: 'submitted', ours: true }]));
    expect(own.body.unit).toMatchObject({ frameSerial: submittedFrame });
    // A brand the shop has no account with (here: an organisation that is not a brand) is not found.
    expect((await call(lookupRoute, { path: `/api/registry/lookup?brand=${await orgId('lanternhill')}&serial=${submittedFrame}` })).status).toBe(404);
    await actAs(PEOPLE.otherBrandRep);
    expect((await call(lookupRoute, { path: `/api/registry/lookup?brand=${torvane}&serial=${submittedFrame}` })).status).toBe(403);
  });

  it('a malformed id is refused without a database error', async () => {
    await actAs(PEOPLE.dealer);
    expect((await call(getClaimRoute, { params: { id: 'not-a-uuid' } })).status).toBe(422);
    expect((await call(attachmentRoute, { params: { id: '1 OR 1=1' } })).status).toBe(422);
  });
});
