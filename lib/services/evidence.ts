import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import { db } from '@/db/connection';
import { ATTACHMENT_LABELS, canAttach, declaredFileProblem, extensionOf, LOAD_TEST_KINDS, PHOTO_KINDS, ruleFor, type AttachmentKind } from '@/lib/claims/attachment-rules';
import { findAttachmentForUser, findIntent, insertAttachment, insertIntent, takeIntent, type UploadIntent } from '@/lib/db/attachments';
import { findClaimForUser, type ClaimRecord } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/errors';
import { cleanPhoto } from '@/lib/files/photos';
import { labelOf, MIME_OF_EXTENSION, sniffType } from '@/lib/files/sniff';
import { logClaimNote } from '@/lib/services/claim-steps';
import { deleteObject, getObjectBytes, headObject, presignGet, presignPut, putObject } from '@/lib/storage/s3';

const INTENT_MINUTES = 15;

function partyOf(user: AppUser): 'dealer' | 'brand_rep' | 'warehouse' | null {
  if (user.orgKind === 'dealer') return 'dealer';
  if (user.role === 'brand_rep' || user.role === 'warehouse') return user.role;
  return null;
}

export function assertMayAttach(user: AppUser, claim: ClaimRecord, kind: AttachmentKind) {
  const who = partyOf(user);
  if (!who || !canAttach(kind, who, claim.stage)) {
    throw new ConflictError(`A ${ATTACHMENT_LABELS[kind].toLowerCase()} cannot be added to this claim now (it is ${claim.stage.replace(/_/g, ' ')}).`, { stage: claim.stage });
  }
}

const safeName = (name: string) => name.normalize('NFKC').replace(/[^\w.\- ]+/g, '_').slice(-120) || 'file';

export type UploadTicket = { intentId: string; url: string; headers: Record<string, string> };

/** Step 1: the browser says what it will send; the server answers with a presigned PUT. */
export async function requestUpload(
  user: AppUser,
  claimId: string,
  f: { kind: AttachmentKind; fileName: string; size: number; sha256: string; contentType: string },
): Promise<UploadTicket> {
  const claim = await findClaimForUser(user, claimId);
  if (!claim) throw new NotFoundError('No such claim.');
  assertMayAttach(user, claim, f.kind);
  const problem = declaredFileProblem(f.kind, f.fileName, f.size);
  if (problem) throw new ValidationError(problem, { file: [problem] });
  const contentType = ruleFor(f.kind).types.includes(f.contentType) ? f.contentType : 'application/octet-stream';
  const storageKey = `claims/${claim.id}/${randomUUID()}/${safeName(f.fileName)}`;
  const intentId = await insertIntent({
    claimId: claim.id, kind: f.kind, storageKey, fileName: f.fileName, declaredType: contentType, declaredSize: f.size,
    declaredSha256: f.sha256.toLowerCase(), createdBy: user.id, expiresAt: new Date(Date.now() + INTENT_MINUTES * 60_000),
  });
  return { intentId, url: await presignPut(storageKey, contentType, INTENT_MINUTES * 60), headers: { 'Content-Type': contentType } };
}

/**
 * The bytes of an upload as stored, once it is certain they are what the browser declared: it
 * arrived in time, with the declared size (within the kind's limit) and the declared SHA-256.
 */
export async function arrivedBytes(intent: UploadIntent): Promise<{ ok: true; bytes: Buffer } | { ok: false; message: string }> {
  if (intent.expiresAt < new Date()) return { ok: false, message: `The upload of ${intent.fileName} took too long; add the file again.` };
  const head = await headObject(intent.storageKey);
  if (!head) return { ok: false, message: `${intent.fileName} never arrived at storage; add it again.` };
  const rule = ruleFor(intent.kind);
  if (head.size !== intent.declaredSize) return { ok: false, message: `${intent.fileName} arrived with ${head.size} bytes instead of ${intent.declaredSize}; add it again.` };
  if (head.size > rule.maxBytes) return { ok: false, message: `${intent.fileName} is larger than allowed (${rule.describe}).` };
  const bytes = await getObjectBytes(intent.storageKey);
  const sha = createHash('sha256').update(bytes).digest('hex');
  if (sha !== intent.declaredSha256) return { ok: false, message: `${intent.fileName} changed on the way (its checksum does not match); add it again.` };
  return { ok: true, bytes };
}

/**
 * Where checked evidence lives: a key the browser was never given. The presigned PUT stays
 * valid for a while on the upload key, so keeping the file there would let it be swapped after
 * the checks (or a photo's metadata put back).
 */
export function sealedKeyFor(uploadKey: string): string {
  const name = uploadKey.split('/').pop() ?? 'file';
  const claim = uploadKey.split('/')[1] ?? 'unknown';
  return `evidence/${claim}/${randomUUID()}/${name}`;
}

export type RecordedAttachment = { id: string; kind: AttachmentKind; fileName: string; contentType: string; sizeBytes: number; sha256: string };

/**
 * Step 2: after the browser's PUT, the server checks the stored object itself — it arrived,
 * its size and SHA-256 match what was declared, its bytes are of an accepted type that agrees
 * with its name — strips photo metadata, and only then records it. Any refusal removes the
 * object and the ticket, so nothing is left behind.
 */
export async function completeUpload(user: AppUser, claimId: string, intentId: string): Promise<RecordedAttachment> {
  const claim = await findClaimForUser(user, claimId);
  if (!claim) throw new NotFoundError('No such claim.');
  // Load tests are analysed as they are recorded, with their test conditions (lib/services/load-tests.ts);
  // their ticket is left for that route.
  const peek = await findIntent(claim.id, intentId, user.id);
  if (peek && LOAD_TEST_KINDS.includes(peek.kind)) {
    throw new ValidationError('A load test is added with its test conditions: use the load-test form on the claim.', { file: ['Use the load-test form.'] });
  }
  // The ticket is used up here, whatever the outcome: a second completion of the same upload
  // (a double click, a retry racing the first) finds none and cannot touch the stored object.
  const intent = await takeIntent(claim.id, intentId, user.id);
  if (!intent) throw new NotFoundError('No such upload; start it again.');
  const cleanup: string[] = [intent.storageKey];
  const refuse = async (message: string): Promise<never> => {
    await Promise.allSettled(cleanup.map((k) => deleteObject(k)));
    throw new ValidationError(message, { file: [message] });
  };

  try {
    const arrived = await arrivedBytes(intent);
    if (!arrived.ok) return await refuse(arrived.message);
    const bytes = arrived.bytes;
    const rule = ruleFor(intent.kind);

    const sniffed = await sniffType(bytes, { expectCsv: intent.kind === 'load_test_before' || intent.kind === 'load_test_after' });
    if (!sniffed.mime || !rule.types.includes(sniffed.mime)) {
      const hint = sniffed.mime === 'image/heic' || sniffed.mime === 'image/heif' ? ' Export it as JPEG (or set the camera to “most compatible”) and add it again.' : '';
      return await refuse(`${intent.fileName} is ${sniffed.label}; ${ATTACHMENT_LABELS[intent.kind].toLowerCase()} takes ${rule.describe}.${hint}`);
    }
    const promised = MIME_OF_EXTENSION[extensionOf(intent.fileName)] ?? [];
    if (!promised.includes(sniffed.mime)) {
      return await refuse(`${intent.fileName} is named .${extensionOf(intent.fileName)} but it is ${labelOf(sniffed.mime)}. Rename it correctly or export it again.`);
    }

    let storedBytes = bytes;
    let thumbnailKey: string | null = null;
    const storageKey = sealedKeyFor(intent.storageKey);
    cleanup.push(storageKey);
    if (PHOTO_KINDS.includes(intent.kind)) {
      let cleaned;
      try {
        cleaned = await cleanPhoto(bytes, sniffed.mime);
      } catch {
        return await refuse(`${intent.fileName} could not be read as a photo; it may be damaged.`);
      }
      storedBytes = cleaned.photo;
      thumbnailKey = `${storageKey}.thumb.webp`;
      cleanup.push(thumbnailKey);
      await putObject(thumbnailKey, cleaned.thumbnail, 'image/webp');
    }
    await putObject(storageKey, storedBytes, sniffed.mime);
    const storedSha = createHash('sha256').update(storedBytes).digest('hex');

    const recorded = await db().transaction(async (trx) => {
      const locked = await findClaimForUser(user, claim.id, trx, true);
      if (!locked) throw new NotFoundError('No such claim.');
      assertMayAttach(user, locked, intent.kind);
      const id = await insertAttachment(trx, {
        claimId: claim.id, kind: intent.kind, storageKey, thumbnailKey, fileName: intent.fileName,
        contentType: sniffed.mime!, sizeBytes: storedBytes.length, sha256: storedSha, uploadedBy: user.id,
      });
      await logClaimNote(trx, user, locked, 'EVIDENCE_ADDED', { attachmentId: id, kind: intent.kind, fileName: intent.fileName, sha256: storedSha });
      return { id, kind: intent.kind, fileName: intent.fileName, contentType: sniffed.mime!, sizeBytes: storedBytes.length, sha256: storedSha };
    });
    await deleteObject(intent.storageKey).catch(() => {});
    return recorded;
  } catch (err) {
    if (!(err instanceof ValidationError)) await Promise.allSettled(cleanup.map((k) => deleteObject(k)));
    throw err;
  }
}

/** A wrong file added to a draft can be taken out again; later the evidence stays. */
export async function removeAttachment(user: AppUser, claimId: string, attachmentId: string): Promise<void> {
  const keys = await db().transaction(async (trx) => {
    const claim = await findClaimForUser(user, claimId, trx, true);
    if (!claim) throw new NotFoundError('No such claim.');
    const att = await trx('attachments').where({ id: attachmentId, claim_id: claim.id }).first('id', 'kind', 'file_name', 'storage_key', 'thumbnail_key', 'uploaded_by');
    if (!att) throw new NotFoundError('No such file on this claim.');
    if (user.orgKind !== 'dealer' || !['draft', 'waiting_on_dealer'].includes(claim.stage)) {
      throw new ConflictError('Evidence the brand has seen stays on the claim; add a new file instead.', { stage: claim.stage });
    }
    if (claim.stage === 'waiting_on_dealer') {
      const seen = await trx('claim_events').where({ claim_id: claim.id }).whereIn('event', ['SUBMIT', 'RESUBMIT']).max('created_at as at').first();
      const added = await trx('claim_events').where({ claim_id: claim.id, event: 'EVIDENCE_ADDED' }).whereRaw(`payload->>'attachmentId' = ?`, [attachmentId]).first('created_at');
      if (seen?.at && added && added.created_at <= seen.at) throw new ConflictError('Evidence the brand has seen stays on the claim; add a new file instead.', { stage: claim.stage });
    }
    await trx('attachments').where({ id: att.id }).delete();
    await logClaimNote(trx, user, claim, 'EVIDENCE_REMOVED', { attachmentId: att.id, kind: att.kind, fileName: att.file_name });
    return [att.storage_key as string, att.thumbnail_key as string | null];
  });
  await Promise.allSettled(keys.filter((k): k is string => !!k).map((k) => deleteObject(k)));
}

/** A short-lived link for a party of the claim; anyone else gets not-found. */
export async function attachmentLink(user: AppUser, attachmentId: string, thumbnail: boolean): Promise<string> {
  const att = await findAttachmentForUser(user, attachmentId);
  if (!att) throw new NotFoundError('No such file.');
  if (thumbnail && att.thumbnailKey) return presignGet(att.thumbnailKey);
  const inline = att.contentType.startsWith('image/') || att.contentType === 'application/pdf';
  return presignGet(att.storageKey, { fileName: att.fileName, inline });
}
