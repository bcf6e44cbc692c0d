import sharp from 'sharp';
import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { MB } from '@/lib/claims/attachment-rules';
import { getObjectBytes, headObject } from '@/lib/storage/s3';
import { dynoCsv, labelPhoto } from '../../support/evidence-files';
import { actAs } from '../../support/acting-user';
import { call, createDraft, PEOPLE, registerBike, sha256, tag, upload } from './support';
import { POST as requestUploadRoute } from '@/app/api/claims/[id]/uploads/route';
import { POST as completeUploadRoute } from '@/app/api/claims/[id]/uploads/[intentId]/route';

const t = tag();
let claimId: string;

const counts = async () => ({
  attachments: Number((await db()('attachments').where({ claim_id: claimId }).count('id as n').first())!.n),
  intents: Number((await db()('upload_intents').where({ claim_id: claimId }).count('id as n').first())!.n),
  evidenceEvents: Number((await db()('claim_events').where({ claim_id: claimId, event: 'EVIDENCE_ADDED' }).count('id as n').first())!.n),
});

/** The storage key the server picked for a ticket, to check the object is gone after a refusal. */
const keyOfTicket = async (url: string) => decodeURIComponent(new URL(url).pathname.replace(/^\/[^/]+\//, ''));

beforeAll(async () => {
  await registerBike(`UP${t}-1`);
  claimId = (await createDraft(PEOPLE.dealer, `UP${t}-1`)).id;
});
beforeEach(() => actAs(PEOPLE.dealer));

describe('upload verification refusals leave nothing behind', () => {
  async function expectRefusedAtCompletion(f: Parameters<typeof upload>[1], message: RegExp) {
    const before = await counts();
    const r = await upload(claimId, f);
    expect(r.ticket.status).toBe(201);
    expect(r.complete?.status).toBe(422);
    expect(r.complete?.body.error).toMatch(message);
    expect(await counts()).toEqual(before);
    const key = await keyOfTicket(r.ticket.body.url);
    expect(key).toMatch(new RegExp(`^claims/${claimId}/`));
    expect(await headObject(key)).toBeNull();
    expect(await headObject(`${key}.thumb.webp`)).toBeNull();
  }

  it('a file declared larger than its kind allows is refused before any upload ticket exists', async () => {
    const before = await counts();
    const r = await call(requestUploadRoute, {
      method: 'POST', params: { id: claimId },
      body: { kind: 'photo', fileName: 'huge.jpg', size: 15 * MB + 1, sha256: 'a'.repeat(64) },
    });
    expect(r.status).toBe(422);
    expect(r.body.error).toMatch(/huge\.jpg is 15\.0 MB; photo of the fault takes JPEG, PNG or WebP photos up to 15 MB/);
    const csv = await call(requestUploadRoute, { method: 'POST', params: { id: claimId }, body: { kind: 'load_test_before', fileName: 'run.csv', size: 50 * MB + 1, sha256: 'a'.repeat(64) } });
    expect(csv.status).toBe(422);
    const ext = await call(requestUploadRoute, { method: 'POST', params: { id: claimId }, body: { kind: 'photo', fileName: 'photo.gif', size: 100, sha256: 'a'.repeat(64) } });
    expect(ext.body.error).toMatch(/not one of the accepted files/);
    const empty = await call(requestUploadRoute, { method: 'POST', params: { id: claimId }, body: { kind: 'photo', fileName: 'photo.jpg', size: 0, sha256: 'a'.repeat(64) } });
    expect(empty.status).toBe(422);
    expect(await counts()).toEqual(before);
  });

  it('bytes of the wrong real type (a ZIP named .jpg) are refused', async () => {
    const zip = Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x00, 0x00]), Buffer.alloc(200, 1)]);
    await expectRefusedAtCompletion({ kind: 'photo', fileName: 'fault.jpg', bytes: zip }, /fault\.jpg is a ZIP file; photo of the fault takes JPEG, PNG or WebP photos/);
  });

  it('a PDF as a photo is refused, naming what it really is', async () => {
    await expectRefusedAtCompletion({ kind: 'photo', fileName: 'receipt.jpg', bytes: Buffer.from('%PDF-1.4\n%âãÏÓ\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n') }, /receipt\.jpg is a PDF document/);
  });

  it('a lying extension (a real PNG named .jpg) is refused', async () => {
    await expectRefusedAtCompletion({ kind: 'photo', fileName: 'label.jpg', bytes: await labelPhoto('PNG', { format: 'png' }) }, /named \.jpg but it is a PNG image/);
  });

  it('an object that never arrived at storage is refused', async () => {
    await expectRefusedAtCompletion({ kind: 'photo', fileName: 'lost.jpg', bytes: await labelPhoto('lost'), put: null }, /lost\.jpg never arrived at storage/);
  });

  it('a checksum mismatch (the bytes changed on the way) is refused', async () => {
    const bytes = await labelPhoto('original');
    const other = Buffer.from(bytes);
    other[other.length - 3] = other[other.length - 3]! ^ 0xff;
    await expectRefusedAtCompletion({ kind: 'photo', fileName: 'changed.jpg', bytes, put: other }, /changed\.jpg changed on the way/);
  });

  it('a size mismatch (more bytes arrived than declared) is refused', async () => {
    const bytes = await labelPhoto('short');
    await expectRefusedAtCompletion({ kind: 'photo', fileName: 'grown.jpg', bytes, put: Buffer.concat([bytes, Buffer.alloc(1000)]) }, /grown\.jpg arrived with \d+ bytes instead of \d+/);
  });

  it('a binary file as a load test is refused', async () => {
    await expectRefusedAtCompletion({ kind: 'load_test_before', fileName: 'run.csv', bytes: Buffer.from([0x00, 0x01, 0x02, 0xff, 0xfe, 0x00]) }, /run\.csv could not be read as a dyno run; nothing was added/);
  });

  it('a ticket can be completed once: the same completion twice records one file and keeps its object', async () => {
    const bytes = await labelPhoto('twice');
    const ticket = await call(requestUploadRoute, { method: 'POST', params: { id: claimId }, body: { kind: 'photo', fileName: 'twice.jpg', size: bytes.length, sha256: sha256(bytes) } });
    await fetch(ticket.body.url, { method: 'PUT', headers: ticket.body.headers, body: new Uint8Array(bytes) });
    const before = await counts();
    const complete = () => call(completeUploadRoute, { method: 'POST', params: { id: claimId, intentId: ticket.body.intentId } });
    const results = await Promise.all([complete(), complete()]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 404]);
    const after = await counts();
    expect(after).toEqual({ attachments: before.attachments + 1, intents: before.intents - 1, evidenceEvents: before.evidenceEvents + 1 });
    const att = await db()('attachments').where({ id: results.find((r) => r.status === 200)!.body.id }).first();
    const stored = await getObjectBytes(att.storage_key);
    expect(sha256(stored)).toBe(att.sha256);
    expect(await headObject(att.thumbnail_key)).not.toBeNull();
  });

  it('another shop cannot complete this shop’s ticket, and the ticket still works for its owner', async () => {
    const bytes = await labelPhoto('mine');
    const ticket = await call(requestUploadRoute, { method: 'POST', params: { id: claimId }, body: { kind: 'photo', fileName: 'mine.jpg', size: bytes.length, sha256: sha256(bytes) } });
    await fetch(ticket.body.url, { method: 'PUT', headers: ticket.body.headers, body: new Uint8Array(bytes) });
    await actAs(PEOPLE.otherShop);
    expect((await call(completeUploadRoute, { method: 'POST', params: { id: claimId, intentId: ticket.body.intentId } })).status).toBe(404);
    // A colleague in the same shop did not ask for this ticket either.
    await actAs(PEOPLE.dealerAdmin);
    expect((await call(completeUploadRoute, { method: 'POST', params: { id: claimId, intentId: ticket.body.intentId } })).status).toBe(404);
    await actAs(PEOPLE.dealer);
    expect((await call(completeUploadRoute, { method: 'POST', params: { id: claimId, intentId: ticket.body.intentId } })).status).toBe(200);
  });
});

describe('photos are stored without their metadata', () => {
  it('the EXIF block with the GPS position and camera owner is gone from the stored photo and its thumbnail', async () => {
    const original = await labelPhoto('SN DU85-GPS', { withGps: true });
    const meta = await sharp(original).metadata();
    expect(meta.exif).toBeDefined();
    expect(original.includes(Buffer.from('GPS'))).toBe(false); // tags are numeric in EXIF; check the parsed block instead
    expect(meta.exif!.includes(Buffer.from('Owner Name'))).toBe(true);

    const r = await upload(claimId, { kind: 'serial_label_photo', fileName: 'label-gps.jpg', bytes: original });
    expect(r.complete?.status).toBe(200);
    const att = await db()('attachments').where({ id: r.complete!.body.id }).first();
    const stored = await getObjectBytes(att.storage_key);
    const storedMeta = await sharp(stored).metadata();
    expect(storedMeta.exif).toBeUndefined();
    expect(storedMeta.format).toBe('jpeg');
    expect(stored.includes(Buffer.from('Owner Name'))).toBe(false);
    expect(stored.includes(Buffer.from('TestCam'))).toBe(false);
    expect((await sharp(await getObjectBytes(att.thumbnail_key)).metadata()).exif).toBeUndefined();
    // The record describes the stored (clean) bytes, not the upload.
    expect(att.sha256).toBe(sha256(stored));
    expect(Number(att.size_bytes)).toBe(stored.length);
    expect(att.sha256).not.toBe(sha256(original));
  });

  it('the upload link cannot change a file once it is checked: a second PUT on it leaves the evidence as recorded', async () => {
    const original = await labelPhoto('SN DU85-SWAP', { withGps: true });
    const r = await upload(claimId, { kind: 'photo', fileName: 'swap.jpg', bytes: original });
    expect(r.complete?.status).toBe(200);
    const att = await db()('attachments').where({ id: r.complete!.body.id }).first();
    expect(att.storage_key).not.toContain(r.ticket.body.intentId);
    expect(att.storage_key.startsWith('evidence/')).toBe(true);
    // The presigned link is still within its time; whatever it accepts now is not the evidence.
    await fetch(r.ticket.body.url, { method: 'PUT', headers: r.ticket.body.headers, body: new Uint8Array(original) });
    const stored = await getObjectBytes(att.storage_key);
    expect(sha256(stored)).toBe(att.sha256);
    expect((await sharp(stored).metadata()).exif).toBeUndefined();
  });

  it('a load-test CSV is stored byte for byte as uploaded', async () => {
    const csv = Buffer.from(dynoCsv({ peakW: 300 }));
    const r = await upload(claimId, { kind: 'load_test_before', fileName: 'dyno.csv', bytes: csv });
    const att = await db()('attachments').where({ id: r.complete!.body.id }).first();
    expect((await getObjectBytes(att.storage_key)).equals(csv)).toBe(true);
    expect(att).toMatchObject({ content_type: 'text/csv', sha256: sha256(csv) });
  });
});
