import { randomBytes, randomUUID } from 'node:crypto';
import { POST as postMessageRoute } from '@/app/api/claims/[id]/messages/route';
import { POST as postStep } from '@/app/api/claims/[id]/steps/route';
import { GET as getQueue } from '@/app/api/review/route';
import { db } from '@/db/connection';
import { createDraft, submitClaim } from '@/lib/services/claims';
import { findActiveUser } from '@/lib/db/users';
import { actAs } from '../../support/acting-user';
import { insertAnalysedLoadTest } from '../../support/analysed-load-test';

export const DEALER = 'lena.hartmann@kettenblatt.test';
export const DEALER_ADMIN = 'jonas.weber@kettenblatt.test';
export const OTHER_DEALER = 'sam.okafor@lanternhill.test';
export const REP = 'priya.nair@torvane.test';
export const REP2 = 'owen.brandt@torvane.test';
export const FOREIGN_REP = 'ines.costa@wrenfield.test';
export const WAREHOUSE = 'felix.moreau@torvane.test';

export async function orgId(slug: string): Promise<string> {
  return (await db()('organisations').where({ slug }).first('id')).id;
}

async function partId(brandId: string, partNumber: string): Promise<string> {
  return (await db()('parts').where({ brand_id: brandId, part_number: partNumber }).first('id')).id;
}

export async function laborId(brandId: string, code: string): Promise<string> {
  return (await db()('labor_operations').where({ brand_id: brandId, code }).first('id')).id;
}

/** Evidence rows as the upload check would leave them; the files themselves are not needed here. */
async function attachEvidence(claimId: string, uploadedBy: string) {
  // A before-test counts only with its analysis.
  await insertAnalysedLoadTest(claimId, uploadedBy);
  for (const kind of ['serial_label_photo', 'photo']) {
    const sha = randomBytes(32).toString('hex');
    await db()('attachments').insert({
      claim_id: claimId, kind, storage_key: `tests/${claimId}/${randomUUID()}`, file_name: `${kind}.${kind === 'load_test_before' ? 'csv' : 'jpg'}`,
      content_type: kind === 'load_test_before' ? 'text/csv' : 'image/jpeg', size_bytes: 1000, sha256: sha, uploaded_by: uploadedBy,
    });
  }
}

export type FiledClaim = { id: string; number: string; brandId: string };

/**
 * A Torvane drive-unit claim from Kettenblatt, submitted: two DU85 units requested (so a rep can
 * approve one), the remove-and-refit and load-test operations, and 18.50 freight.
 */
export async function submittedClaim(opts: { dealer?: string; frameSerial?: string; submit?: boolean; fromDealerStock?: boolean } = {}): Promise<FiledClaim> {
  const dealerEmail = opts.dealer ?? DEALER;
  const uid = await actAs(dealerEmail);
  const user = (await findActiveUser(uid!))!;
  const brandId = await orgId('torvane');
  const du85 = await partId(brandId, 'TV-DU85');
  const draft = await createDraft(user, {
    brandId, frameSerial: opts.frameSerial ?? 'KT25-004187', partId: du85, partSerial: 'DU85-2503-11872', failureDate: '2026-11-20',
    symptom: 'Assist cuts out under load', errorCodes: 'E-042', description: 'Dyno shows power collapse above 15 km/h.',
    customerName: 'Test Rider', customerEmail: '', customerPhone: '',
    parts: [{ partId: du85, quantity: 2, fromDealerStock: opts.fromDealerStock ?? false }],
    labor: [{ operationId: await laborId(brandId, 'DU-RR') }, { operationId: await laborId(brandId, 'LT-BA') }],
    freight: '18.50',
  } as never);
  await attachEvidence(draft.id, user.id);
  if (opts.submit !== false) await submitClaim(user, draft.id);
  return { id: draft.id, number: draft.number, brandId };
}

export async function claimRow(id: string) {
  return db()('claims').where({ id }).first();
}

export async function events(id: string, event?: string) {
  const q = db()('claim_events').where({ claim_id: id }).orderBy('id');
  if (event) q.where({ event });
  return q;
}

type Answer = { status: number; body: Record<string, any> };

async function answer(res: Response): Promise<Answer> {
  return { status: res.status, body: (await res.json()) as Record<string, any> };
}

/** POST /api/claims/[id]/steps as the given user. */
export async function step(email: string, claimId: string, body: Record<string, unknown>): Promise<Answer> {
  await actAs(email);
  const req = new Request(`http://test/api/claims/${claimId}/steps`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  return answer(await postStep(req, { params: Promise.resolve({ id: claimId }) }));
}

/** The claim's current version, as a screen would have it. */
export async function versionOf(id: string): Promise<number> {
  return (await claimRow(id)).version;
}

export async function take(email: string, id: string): Promise<Answer> {
  return step(email, id, { type: 'TAKE', version: await versionOf(id) });
}

export async function message(email: string, claimId: string, body: Record<string, unknown>): Promise<Answer> {
  await actAs(email);
  const req = new Request(`http://test/api/claims/${claimId}/messages`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  return answer(await postMessageRoute(req, { params: Promise.resolve({ id: claimId }) }));
}

export async function queue(email: string, params: Record<string, string> = {}): Promise<Answer> {
  await actAs(email);
  const req = new Request(`http://test/api/review?${new URLSearchParams(params)}`);
  return answer(await getQueue(req, { params: Promise.resolve({}) }));
}

/** Notification and outbox rows about one claim, by recipient e-mail. */
export async function notesFor(claimId: string) {
  return db()('notifications as n')
    .join('users as u', 'u.id', 'n.user_id')
    .leftJoin('outbox as o', 'o.notification_id', 'n.id')
    .where('n.claim_id', claimId)
    .orderBy('n.id')
    .select('n.kind', 'n.title', 'u.email', 'o.to_email as mailTo', 'o.subject');
}

/** The approval body for every line as requested. */
export async function fullApproval(id: string) {
  const c = await claimRow(id);
  const req = c.requested_lines;
  return {
    parts: req.parts.map((p: any) => ({ lineId: p.lineId, quantity: p.quantity })),
    labor: req.labor.map((l: any) => ({ lineId: l.lineId, operationId: l.operationId, hours: l.hours })),
    freight: (req.freightMinor / 100).toFixed(2),
  };
}
