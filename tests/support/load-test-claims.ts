import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { POST as postLoadTest } from '@/app/api/claims/[id]/load-tests/route';
import { POST as postStep } from '@/app/api/claims/[id]/steps/route';
import { POST as postUpload } from '@/app/api/claims/[id]/uploads/route';
import { db } from '@/db/connection';
import { findActiveUser, type AppUser } from '@/lib/db/users';
import { applyStep } from '@/lib/services/claim-steps';
import { createDraft, submitClaim } from '@/lib/services/claims';
import { actAs } from './acting-user';

// Claims for the load-test tests: filed through the services, load tests uploaded to the real
// (local) storage and recorded through the route handler, and steps through applyStep.

export const PEOPLE = {
  kettenblatt: 'lena.hartmann@kettenblatt.test',
  kettenblattAdmin: 'jonas.weber@kettenblatt.test',
  lanternhill: 'sam.okafor@lanternhill.test',
  torvaneRep: 'priya.nair@torvane.test',
  torvaneRep2: 'owen.brandt@torvane.test',
  torvaneWarehouse: 'felix.moreau@torvane.test',
  wrenfieldRep: 'ines.costa@wrenfield.test',
} as const;

export const fixture = (name: string): Buffer => readFileSync(path.resolve('tests/fixtures/loadtest', name));

export async function signedIn(email: string): Promise<AppUser> {
  const id = await actAs(email);
  const user = await findActiveUser(id!);
  if (!user) throw new Error(`no user ${email}`);
  return user;
}

const orgId = async (slug: string) => (await db()('organisations').where({ slug }).first('id')).id as string;
const partId = async (brandId: string, partNumber: string) => (await db()('parts').where({ brand_id: brandId, part_number: partNumber }).first('id')).id as string;

/**
 * A draft against Torvane on a registered bike: by default Kettenblatt's Kestrel Trek 625
 * (EU pedelec, 50-622 tyres) with a failed DU85 drive unit, one DU85 and the refit operation requested.
 */
export async function draftClaim(opts: { dealer?: string; frameSerial?: string; partNumber?: string; batteryCycles?: number } = {}) {
  const user = await signedIn(opts.dealer ?? PEOPLE.kettenblatt);
  const brandId = await orgId('torvane');
  const part = await partId(brandId, opts.partNumber ?? 'TV-DU85');
  const op = (await db()('labor_operations').where({ brand_id: brandId, code: 'DU-RR' }).first('id')).id;
  const draft = await createDraft(user, {
    brandId, frameSerial: opts.frameSerial ?? 'KT25-004187', partId: part, partSerial: `PS-${randomBytes(3).toString('hex')}`,
    failureDate: '2026-11-20', symptom: 'Assist cuts out under load', errorCodes: '', description: 'Load-test test claim.',
    customerName: '', customerEmail: '', customerPhone: '', batteryCycles: opts.batteryCycles,
    parts: [{ partId: part, quantity: 1, fromDealerStock: false }], labor: [{ operationId: op }], freight: '',
  } as never);
  return { ...draft, brandId, user };
}

export type Answer = { status: number; body: Record<string, any> };
const answer = async (res: Response): Promise<Answer> => ({ status: res.status, body: (await res.json()) as Record<string, any> });
const jsonRequest = (url: string, body: unknown) =>
  new Request(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

/** Asks for an upload ticket and puts the bytes to storage, as the browser does. */
export async function putFile(email: string, claimId: string, kind: 'load_test_before' | 'load_test_after', fileName: string, bytes: Buffer): Promise<Answer & { intentId?: string; storageKey?: string }> {
  await actAs(email);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const ticket = await answer(
    await postUpload(jsonRequest(`http://test/api/claims/${claimId}/uploads`, { kind, fileName, size: bytes.length, sha256, contentType: 'text/csv' }), {
      params: Promise.resolve({ id: claimId }),
    }),
  );
  if (ticket.status !== 201) return ticket;
  const put = await fetch(ticket.body.url, { method: 'PUT', headers: ticket.body.headers, body: new Uint8Array(bytes) });
  if (!put.ok) throw new Error(`storage refused the PUT: ${put.status}`);
  const intent = await db()('upload_intents').where({ id: ticket.body.intentId }).first('storage_key');
  return { ...ticket, intentId: ticket.body.intentId, storageKey: intent.storage_key };
}

/** POST /api/claims/[id]/load-tests as the given user. */
export async function recordLoadTest(email: string, claimId: string, body: Record<string, unknown>): Promise<Answer> {
  await actAs(email);
  return answer(await postLoadTest(jsonRequest(`http://test/api/claims/${claimId}/load-tests`, body), { params: Promise.resolve({ id: claimId }) }));
}

/** Upload and record in one go; `conditions` are typed in `units`. */
export async function addLoadTest(
  email: string,
  claimId: string,
  file: { name: string; bytes: Buffer; kind?: 'load_test_before' | 'load_test_after' },
  extra: { units?: 'metric' | 'imperial'; conditions?: Record<string, string>; mapping?: unknown } = {},
): Promise<Answer & { intentId?: string; storageKey?: string }> {
  const put = await putFile(email, claimId, file.kind ?? 'load_test_before', file.name, file.bytes);
  if (!put.intentId) return put;
  const res = await recordLoadTest(email, claimId, {
    intentId: put.intentId, units: extra.units ?? 'metric', conditions: extra.conditions ?? { tyreSize: '57-622', batterySocStartPct: '100' },
    ...(extra.mapping ? { mapping: extra.mapping } : {}),
  });
  return { ...res, intentId: put.intentId, storageKey: put.storageKey };
}

/** POST /api/claims/[id]/steps as the given user. */
export async function step(email: string, claimId: string, body: Record<string, unknown>): Promise<Answer> {
  await actAs(email);
  return answer(await postStep(jsonRequest(`http://test/api/claims/${claimId}/steps`, body), { params: Promise.resolve({ id: claimId }) }));
}

/** Photo rows as the upload check leaves them; the photos themselves are not what these tests are about. */
export async function attachPhotos(claimId: string, uploadedBy: string): Promise<void> {
  for (const kind of ['serial_label_photo', 'photo']) {
    await db()('attachments').insert({
      claim_id: claimId, kind, storage_key: `tests/${claimId}/${randomUUID()}.jpg`, file_name: `${kind}.jpg`, content_type: 'image/jpeg',
      size_bytes: 1000, sha256: randomBytes(32).toString('hex'), uploaded_by: uploadedBy,
    });
  }
}

/**
 * Drives a draft that has its before-test to `shipped` through applyStep: SUBMIT (dealer), TAKE and
 * APPROVE (rep, every requested line), SHIP (warehouse).
 */
export async function driveToShipped(claimId: string, dealerEmail: string = PEOPLE.kettenblatt, opts: { stopAfter?: 'APPROVE' } = {}): Promise<void> {
  const dealer = await signedIn(dealerEmail);
  await attachPhotos(claimId, dealer.id);
  await submitClaim(dealer, claimId);
  const rep = await signedIn(PEOPLE.torvaneRep);
  await applyStep(rep, claimId, 'TAKE', {});
  const row = await db()('claims').where({ id: claimId }).first('requested_lines');
  const lines = [...row.requested_lines.parts, ...row.requested_lines.labor].map((l: { lineId: string }) => ({ lineId: l.lineId, approved: true }));
  await applyStep(rep, claimId, 'APPROVE', { extent: 'full', lines, rmaNumber: `RMA-T-${randomBytes(4).toString('hex')}` });
  if (opts.stopAfter === 'APPROVE') return;
  const warehouse = await signedIn(PEOPLE.torvaneWarehouse);
  await applyStep(warehouse, claimId, 'SHIP', { carrier: 'Test Parcel', trackingNumber: `TP${randomBytes(4).toString('hex')}` });
}

export async function claimRow(id: string) {
  return db()('claims').where({ id }).first();
}

export async function runsOf(claimId: string) {
  return db()('load_test_runs').where({ claim_id: claimId }).orderBy('created_at');
}

export async function attachmentsOf(claimId: string, kind?: string) {
  const q = db()('attachments').where({ claim_id: claimId });
  if (kind) q.where({ kind });
  return q;
}

/** A dyno CSV in our column layout: a sweep from 2 to 25 km/h whose power peaks at `peakW` near 20 km/h, torque consistent with 57-622. */
export function dynoCsv(opts: { peakW?: number; samples?: number } = {}): Buffer {
  const peak = opts.peakW ?? 520;
  const n = opts.samples ?? 400;
  const r = (Math.PI * (622 + 2 * 57)) / 1000 / (2 * Math.PI);
  const lines = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
  for (let i = 0; i < n; i++) {
    const kmh = 2 + (23 * i) / n;
    const p = Math.max(5, peak * Math.exp(-(((kmh - 20) / 9) ** 2)));
    lines.push(`${(i * 0.05).toFixed(2)},${kmh.toFixed(3)},${(p / (kmh / 3.6 / r)).toFixed(3)},${p.toFixed(2)}`);
  }
  return Buffer.from(lines.join('\n') + '\n');
}
