import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { removeAbandonedUploads } from '@/lib/jobs/upload-cleanup';
import { headObject } from '@/lib/storage/s3';
import { actAs } from '../../support/acting-user';
import { labelPhoto } from '../../support/evidence-files';
import { createDraft, PEOPLE, registerBike, tag, upload } from './support';

describe('abandoned uploads', () => {
  it('a ticket never completed is removed with its object once expired; a live one stays', async () => {
    const frame = `AB-${tag()}`;
    await registerBike(frame);
    const draft = await createDraft(PEOPLE.dealer, frame);
    await actAs(PEOPLE.dealer);
    const photo = await labelPhoto('SN LEFT-BEHIND');
    const left = await upload(draft.id, { kind: 'photo', fileName: 'left.jpg', bytes: photo, put: photo });
    // upload() completes the ticket; make two fresh ones that the browser never completes.
    const { POST } = await import('@/app/api/claims/[id]/uploads/route');
    const { call, sha256 } = await import('./support');
    const ticket = async () => (await call(POST, { method: 'POST', params: { id: draft.id }, body: { kind: 'photo', fileName: 'x.jpg', size: photo.length, sha256: sha256(photo) } })).body;
    const old = await ticket();
    const live = await ticket();
    for (const t of [old, live]) await fetch(t.url, { method: 'PUT', headers: t.headers, body: new Uint8Array(photo) });
    await db()('upload_intents').where({ id: old.intentId }).update({ expires_at: db().raw(`now() - interval '1 minute'`) });
    const oldKey = (await db()('upload_intents').where({ id: old.intentId }).first('storage_key')).storage_key;
    const liveKey = (await db()('upload_intents').where({ id: live.intentId }).first('storage_key')).storage_key;

    expect(await removeAbandonedUploads()).toBeGreaterThanOrEqual(1);
    expect(await db()('upload_intents').where({ id: old.intentId }).first()).toBeUndefined();
    expect(await headObject(oldKey)).toBeNull();
    expect(await db()('upload_intents').where({ id: live.intentId }).first()).toBeDefined();
    expect(await headObject(liveKey)).not.toBeNull();
    expect(left.complete?.status).toBe(200);
  });
});
