import 'server-only';
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '@/db/connection';

export type Notification = {
  id: number;
  claimId: string | null;
  kind: string;
  title: string;
  body: string;
  link: string | null;
  createdAt: Date;
  readAt: Date | null;
};

export type MailMessage = { to: string; subject: string; text: string; html?: string };

/** Queues a mail inside the caller's transaction; the worker sends it after commit. */
export async function queueMail(trx: Knex, mail: MailMessage & { claimId?: string; notificationId?: number }): Promise<void> {
  await trx('outbox').insert({
    message_id: `<${randomUUID()}@loadproof.local>`,
    to_email: mail.to,
    subject: mail.subject,
    text_body: mail.text,
    html_body: mail.html ?? null,
    claim_id: mail.claimId ?? null,
    notification_id: mail.notificationId ?? null,
  });
}

/** An in-app notification plus its e-mail, in the caller's transaction. */
export async function notifyUser(
  trx: Knex,
  n: { userId: string; email: string; claimId?: string; kind: string; title: string; body: string; link?: string; mail: Omit<MailMessage, 'to'> },
): Promise<void> {
  const [row] = await trx('notifications')
    .insert({ user_id: n.userId, claim_id: n.claimId ?? null, kind: n.kind, title: n.title, body: n.body, link: n.link ?? null })
    .returning('id');
  await queueMail(trx, { ...n.mail, to: n.email, claimId: n.claimId, notificationId: row.id });
}

export async function unreadNotificationCount(userId: string): Promise<number> {
  const row = await db()('notifications').where({ user_id: userId }).whereNull('read_at').count<{ count: string }[]>('id as count').first();
  return Number(row?.count ?? 0);
}

export async function listNotifications(userId: string, limit = 100): Promise<Notification[]> {
  return db()('notifications')
    .select('id', 'claim_id as claimId', 'kind', 'title', 'body', 'link', 'created_at as createdAt', 'read_at as readAt')
    .where({ user_id: userId })
    .orderBy('created_at', 'desc')
    .orderBy('id', 'desc')
    .limit(limit);
}

export async function markAllRead(userId: string): Promise<void> {
  await db()('notifications').where({ user_id: userId }).whereNull('read_at').update({ read_at: db().fn.now() });
}
