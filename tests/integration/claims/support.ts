import { createHash } from 'node:crypto';
import { POST as loadTestRoute } from '@/app/api/claims/[id]/load-tests/route';
import { POST as completeUploadRoute } from '@/app/api/claims/[id]/uploads/[intentId]/route';
import { POST as requestUploadRoute } from '@/app/api/claims/[id]/uploads/route';
import { POST as createClaimRoute } from '@/app/api/claims/route';
import { POST as stepRoute } from '@/app/api/claims/[id]/steps/route';
import { db } from '@/db/connection';
import { dynoCsv, labelPhoto } from '../../support/evidence-files';
import { actAs } from '../../support/acting-user';

type Handler<P> = (req: Request, ctx: { params: Promise<P> }) => Promise<Response>;
export type Reply = { status: number; body: any; headers: Headers };

/** Calls a route handler the way Next.js would, and reads its JSON answer. */
export async function call<P = Record<string, string>>(
  handler: Handler<P>,
  opts: { method?: string; path?: string; body?: unknown; params?: P } = {},
): Promise<Reply> {
  const init: RequestInit = { method: opts.method ?? 'GET' };
  if (opts.body !== undefined) {
    init.body = JSON.stringify(opts.body);
    init.headers = { 'content-type': 'application/json' };
  }
  const res = await handler(new Request(`http://localhost${opts.path ?? '/'}`, init), { params: Promise.resolve((opts.params ?? {}) as P) });
  const text = await res.text();
  let body: unknown = text;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    // a redirect or other non-JSON answer
  }
  return { status: res.status, body, headers: res.headers };
}

export const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');
export const tag = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e6).toString(36)}`.toUpperCase();

export const PEOPLE = {
  dealer: 'lena.hartmann@kettenblatt.test',
  dealerAdmin: 'jonas.weber@kettenblatt.test',
  otherShop: 'sam.okafor@lanternhill.test',
  rep: 'priya.nair@torvane.test',
  otherBrandRep: 'ines.costa@wrenfield.test',
  warehouse: 'felix.moreau@torvane.test',
  accountant: 'hana.sato@torvane.test',
} as const;

export const orgId = async (slug: string) => (await db()('organisations').where({ slug }).first('id')).id as string;

/** A bike registered with Torvane for this test run only, so claims on it meet no other test's. */
export async function registerBike(frameSerial: string, sold = '2025-06-01'): Promise<void> {
  const brand = await orgId('torvane');
  const model = await db()('bike_models').where({ brand_id: brand, code: 'KST-T' }).first('id');
  await db()('registered_units').insert({
    brand_id: brand, frame_serial: frameSerial, model_id: model.id, retail_sale_date: sold,
    selling_dealer_id: await orgId('kettenblatt'), component_serials: JSON.stringify({ drive_unit: `DU85-${frameSerial}` }),
  });
}

/** A complete draft against Torvane on a registered bike, filed by `email` through the route. */
export async function createDraft(email: string, frameSerial: string, extra: Record<string, unknown> = {}): Promise<{ id: string; number: string }> {
  await actAs(email);
  const brandId = await orgId('torvane');
  const part = await db()('parts').where({ brand_id: brandId, part_number: 'TV-DU85' }).first('id');
  const r = await call(createClaimRoute, {
    method: 'POST',
    path: '/api/claims',
    body: {
      brandId, frameSerial, partId: part.id, partSerial: `DU85-${frameSerial}`, failureDate: '2026-06-10', odometerKm: 1800,
      symptom: 'Assist cuts out on climbs', description: 'Dyno run attached.', customerName: 'Test Rider',
      parts: [{ partId: part.id, quantity: 1 }], ...extra,
    },
  });
  if (r.status !== 201) throw new Error(`draft not created: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

export type UploadOutcome = { ticket: Reply; complete?: Reply };

/** The browser's upload: ask for a ticket, PUT the bytes to storage, ask the server to check them. */
export async function upload(
  claimId: string,
  f: { kind: string; fileName: string; bytes: Buffer; declaredSize?: number; declaredSha?: string; contentType?: string; put?: Buffer | null },
): Promise<UploadOutcome> {
  const ticket = await call(requestUploadRoute, {
    method: 'POST',
    path: `/api/claims/${claimId}/uploads`,
    params: { id: claimId },
    body: { kind: f.kind, fileName: f.fileName, size: f.declaredSize ?? f.bytes.length, sha256: f.declaredSha ?? sha256(f.bytes), contentType: f.contentType ?? '' },
  });
  if (ticket.status !== 201) return { ticket };
  const body = f.put === undefined ? f.bytes : f.put;
  if (body !== null) {
    const res = await fetch(ticket.body.url, { method: 'PUT', headers: ticket.body.headers, body: new Uint8Array(body) });
    if (!res.ok) throw new Error(`storage PUT failed: ${res.status}`);
  }
  if (f.kind === 'load_test_before' || f.kind === 'load_test_after') {
    // A load test is recorded through its own route, with the run's conditions and its analysis.
    const r = await call(loadTestRoute, {
      method: 'POST',
      path: `/api/claims/${claimId}/load-tests`,
      params: { id: claimId },
      body: { intentId: ticket.body.intentId, units: 'metric', conditions: { tyreSize: '50-622' } },
    });
    return { ticket, complete: r.status === 201 ? { ...r, status: 200, body: { ...r.body, id: r.body.attachmentId } } : r };
  }
  const complete = await call(completeUploadRoute, {
    method: 'POST',
    path: `/api/claims/${claimId}/uploads/${ticket.body.intentId}`,
    params: { id: claimId, intentId: ticket.body.intentId },
  });
  return { ticket, complete };
}

/** The evidence a claim needs to go to the brand: two photos (one of the serial label) and a before-test. */
export async function addCompleteEvidence(claimId: string): Promise<void> {
  const files = [
    { kind: 'serial_label_photo', fileName: 'label.jpg', bytes: await labelPhoto('SN DU85-TEST') },
    { kind: 'photo', fileName: 'fault.jpg', bytes: await labelPhoto('fault', { withGps: false }) },
    { kind: 'load_test_before', fileName: 'dyno-before.csv', bytes: Buffer.from(dynoCsv({ peakW: 200 })) },
  ];
  for (const f of files) {
    const r = await upload(claimId, f);
    if (r.complete?.status !== 200) throw new Error(`upload ${f.fileName} failed: ${JSON.stringify(r.complete?.body ?? r.ticket.body)}`);
  }
}

export async function submit(claimId: string, version?: number): Promise<Reply> {
  return call(stepRoute, { method: 'POST', path: `/api/claims/${claimId}/steps`, params: { id: claimId }, body: { type: 'SUBMIT', ...(version === undefined ? {} : { version }) } });
}

/** A claim the brand can see: drafted, evidenced and submitted by the Kettenblatt dealer. */
export async function submittedClaim(frameSerial: string): Promise<{ id: string; number: string }> {
  await registerBike(frameSerial);
  const claim = await createDraft(PEOPLE.dealer, frameSerial);
  await addCompleteEvidence(claim.id);
  const r = await submit(claim.id);
  if (r.status !== 200) throw new Error(`submit failed: ${JSON.stringify(r.body)}`);
  return claim;
}

export const eventsOf = async (claimId: string, event?: string) =>
  db()('claim_events').where({ claim_id: claimId, ...(event ? { event } : {}) }).orderBy('id');
