import 'server-only';
import { db } from '@/db/connection';

export type OutboxMail = { id: number; messageId: string; to: string; subject: string; text: string; html: string | null; attempts: number };

// Longer than the slowest possible batch (200 mails over 16 connections at the 30 s send
// timeout ≈ 6.5 min), so a lease never runs out while its mail is still being sent; a worker that
// dies holds its leased mail back for at most this long.
const LEASE_SECONDS = 15 * 60;

/**
 * Leases up to `limit` due mails. SKIP LOCKED plus the lease lets several workers run
 * without two of them sending the same row.
 */
export async function leaseDueMail(limit: number): Promise<OutboxMail[]> {
  const { rows } = await db().raw(
    `UPDATE outbox SET locked_until = now() + make_interval(secs => ?), attempts = attempts + 1
     WHERE id IN (
       SELECT id FROM outbox
       WHERE status = 'pending' AND next_attempt_at <= now() AND (locked_until IS NULL OR locked_until < now())
       ORDER BY next_attempt_at, id
       LIMIT ?
       FOR UPDATE SKIP LOCKED)
     RETURNING id, message_id AS "messageId", to_email AS "to", subject, text_body AS "text", html_body AS "html", attempts`,
    [LEASE_SECONDS, limit],
  );
  return rows;
}

// An invitation link sets a password: once its mail is out, the copy kept here no longer carries it.
const INVITE_LINK = String.raw`/invite/[A-Za-z0-9_-]+`;
const SENT_LINK = '/invite/(link sent by e-mail)';

export async function markSent(ids: number[]): Promise<void> {
  if (!ids.length) return;
  await db()('outbox').whereIn('id', ids).update({
    status: 'sent', sent_at: db().fn.now(), locked_until: null, last_error: null,
    text_body: db().raw(`regexp_replace(text_body, ?, ?, 'g')`, [INVITE_LINK, SENT_LINK]),
    html_body: db().raw(`regexp_replace(html_body, ?, ?, 'g')`, [INVITE_LINK, SENT_LINK]),
  });
}

export async function markFailed(id: number, error: string, retryInSeconds: number): Promise<void> {
  await db()('outbox')
    .where({ id })
    .update({ locked_until: null, last_error: error.slice(0, 500), next_attempt_at: db().raw(`now() + make_interval(secs => ?)`, [retryInSeconds]) });
}

export async function outboxCounts(): Promise<{ pending: number; sent: number }> {
  const rows = await db()('outbox').select('status').count<{ status: string; count: string }[]>('id as count').groupBy('status');
  const get = (s: string) => Number(rows.find((r) => r.status === s)?.count ?? 0);
  return { pending: get('pending'), sent: get('sent') };
}
