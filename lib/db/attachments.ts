import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { AttachmentKind } from '@/lib/claims/attachment-rules';
import { scopeClaims } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';

export type Attachment = {
  id: string;
  claimId: string;
  kind: AttachmentKind;
  storageKey: string;
  thumbnailKey: string | null;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  uploadedBy: string;
  uploadedByName: string | null;
  createdAt: Date;
};

export type UploadIntent = {
  id: string; claimId: string; kind: AttachmentKind; storageKey: string; fileName: string; declaredType: string;
  declaredSize: number; declaredSha256: string; createdBy: string; expiresAt: Date;
};

const attachmentColumns = [
  't.id', 't.claim_id as claimId', 't.kind', 't.storage_key as storageKey', 't.thumbnail_key as thumbnailKey', 't.file_name as fileName',
  't.content_type as contentType', 't.size_bytes as sizeBytes', 't.sha256', 't.uploaded_by as uploadedBy', 'u.name as uploadedByName',
  't.created_at as createdAt',
];

export async function insertIntent(i: Omit<UploadIntent, 'id'>): Promise<string> {
  const [r] = await db()('upload_intents')
    .insert({
      claim_id: i.claimId, kind: i.kind, storage_key: i.storageKey, file_name: i.fileName, declared_type: i.declaredType,
      declared_size: i.declaredSize, declared_sha256: i.declaredSha256, created_by: i.createdBy, expires_at: i.expiresAt,
    })
    .returning('id');
  return r.id;
}

export async function findIntent(claimId: string, id: string, createdBy: string, q: Knex = db()): Promise<UploadIntent | null> {
  return (
    (await q('upload_intents')
      .select('id', 'claim_id as claimId', 'kind', 'storage_key as storageKey', 'file_name as fileName', 'declared_type as declaredType',
        'declared_size as declaredSize', 'declared_sha256 as declaredSha256', 'created_by as createdBy', 'expires_at as expiresAt')
      .where({ id, claim_id: claimId, created_by: createdBy })
      .first()) ?? null
  );
}

/**
 * Takes a ticket for checking: removes it and returns it in one statement, so of two
 * completions of the same upload only one ever gets it.
 */
export async function takeIntent(claimId: string, id: string, createdBy: string, q: Knex = db()): Promise<UploadIntent | null> {
  const [row] = await q('upload_intents')
    .where({ id, claim_id: claimId, created_by: createdBy })
    .delete()
    .returning(['id', 'claim_id as claimId', 'kind', 'storage_key as storageKey', 'file_name as fileName', 'declared_type as declaredType',
      'declared_size as declaredSize', 'declared_sha256 as declaredSha256', 'created_by as createdBy', 'expires_at as expiresAt']);
  return row ?? null;
}

export async function deleteIntent(id: string, q: Knex = db()): Promise<void> {
  await q('upload_intents').where({ id }).delete();
}

export async function expiredIntents(limit = 100): Promise<{ id: string; storageKey: string }[]> {
  return db()('upload_intents').select('id', 'storage_key as storageKey').where('expires_at', '<', db().fn.now()).limit(limit);
}

export async function insertAttachment(
  trx: Knex,
  a: { claimId: string; kind: AttachmentKind; storageKey: string; thumbnailKey: string | null; fileName: string; contentType: string; sizeBytes: number; sha256: string; uploadedBy: string },
): Promise<string> {
  const [r] = await trx('attachments')
    .insert({
      claim_id: a.claimId, kind: a.kind, storage_key: a.storageKey, thumbnail_key: a.thumbnailKey, file_name: a.fileName,
      content_type: a.contentType, size_bytes: a.sizeBytes, sha256: a.sha256, uploaded_by: a.uploadedBy,
    })
    .returning('id');
  return r.id;
}

export async function listAttachments(claimId: string): Promise<Attachment[]> {
  return db()('attachments as t').leftJoin('users as u', 'u.id', 't.uploaded_by').select(attachmentColumns).where('t.claim_id', claimId).orderBy('t.created_at');
}

/** An attachment only for a party of its claim: the claim scope applies. */
export async function findAttachmentForUser(user: AppUser, id: string): Promise<Attachment | null> {
  const q = db()('attachments as t')
    .join('claims as c', 'c.id', 't.claim_id')
    .leftJoin('users as u', 'u.id', 't.uploaded_by')
    .select(attachmentColumns)
    .where('t.id', id);
  return (await scopeClaims(q, user).first()) ?? null;
}

export async function evidenceCounts(claimId: string, q: Knex = db()): Promise<Record<AttachmentKind, number>> {
  const rows = await q('attachments').select('kind').count<{ kind: AttachmentKind; count: string }[]>('id as count').where({ claim_id: claimId }).groupBy('kind');
  const out = {} as Record<AttachmentKind, number>;
  for (const r of rows) out[r.kind] = Number(r.count);
  return out;
}
