import 'server-only';
import { leaseDueMail, markFailed, markSent } from '@/lib/db/outbox';
import { retryDelaySeconds } from '@/lib/mail/backoff';
import { mailTransport } from '@/lib/mail/transport';
import { env } from '@/lib/env';

/** Sends one batch of due mail (200 at most: a batch ends when its slowest mail is sent); returns how many went out and how many failed. */
export async function deliverOutboxBatch(limit = 200): Promise<{ sent: number; failed: number }> {
  const batch = await leaseDueMail(limit);
  if (!batch.length) return { sent: 0, failed: 0 };
  const from = env().MAIL_FROM;
  const transport = mailTransport();
  const results = await Promise.allSettled(
    batch.map((m) =>
      transport.sendMail({ from, to: m.to, subject: m.subject, text: m.text, html: m.html ?? undefined, messageId: m.messageId }),
    ),
  );
  const sent = batch.filter((_, i) => results[i]!.status === 'fulfilled').map((m) => m.id);
  // What went out is recorded first: a failure while recording the others must not leave a sent
  // mail leased, to be sent again when its lease runs out.
  await markSent(sent);
  let failed = 0;
  for (const [i, r] of results.entries()) {
    if (r.status === 'fulfilled') continue;
    failed++;
    await markFailed(batch[i]!.id, String(r.reason?.message ?? r.reason), retryDelaySeconds(batch[i]!.attempts));
  }
  return { sent: sent.length, failed };
}

/** Drains everything due now (used by the worker loop and by tests). */
export async function drainOutbox(): Promise<{ sent: number; failed: number }> {
  const total = { sent: 0, failed: 0 };
  for (;;) {
    const r = await deliverOutboxBatch();
    total.sent += r.sent;
    total.failed += r.failed;
    if (r.sent === 0) return total;
  }
}
