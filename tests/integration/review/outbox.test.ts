// The outbox against a mail server that is down, then up: the step commits at once, the mail
// goes later, each exactly once. The test runs its own SMTP fake on a spare port.
import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { reloadEnv } from '@/lib/env';
import { deliverOutboxBatch, drainOutbox } from '@/lib/jobs/outbox';
import { resetMailTransport } from '@/lib/mail/transport';
import { startFakeSmtp, type CaughtMail } from '@/scripts/fakes/smtp';
import { claimRow, DEALER, REP, step, submittedClaim, take, versionOf } from './support';

async function sparePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

let port: number;
let fake: Awaited<ReturnType<typeof startFakeSmtp>> | null = null;
const mailbox: CaughtMail[] = [];
const previous = process.env.SMTP_PORT;

beforeAll(async () => {
  port = await sparePort();
  process.env.SMTP_PORT = String(port);
  reloadEnv();
  resetMailTransport();
});

afterAll(async () => {
  // The pooled transport holds its connections open; close it before the server waits on them.
  resetMailTransport();
  await fake?.close();
  if (previous === undefined) delete process.env.SMTP_PORT;
  else process.env.SMTP_PORT = previous;
  reloadEnv();
});

async function rowsOf(claimId: string) {
  return db()('outbox').where({ claim_id: claimId }).orderBy('id').select('id', 'message_id', 'to_email', 'status', 'attempts', 'last_error', 'next_attempt_at', 'sent_at');
}

describe('the outbox with the mail server down, then up', () => {
  it('commits the steps, keeps the mail, retries with backoff, and delivers every mail exactly once', async () => {
    // Mail server down: nothing listens on the port.
    const c = await submittedClaim();
    await take(REP, c.id);
    const r = await step(REP, c.id, { type: 'REQUEST_INFO', version: await versionOf(c.id), items: [{ key: 'diagnostic_log' }], message: 'Log, please.' });
    expect(r.status).toBe(200);
    expect((await claimRow(c.id)).stage).toBe('waiting_on_dealer');
    const queued = await rowsOf(c.id);
    expect(queued.length).toBe(4); // submitted → 2 reps; more asked → dealer and shop admin
    expect(queued.every((m) => m.status === 'pending')).toBe(true);

    // Other tests may have left mail queued ahead of ours: try batches until ours have had their attempt.
    let sentWhileDown = 0;
    for (let i = 0; i < 200 && (await rowsOf(c.id)).some((m) => m.attempts === 0); i++) sentWhileDown += (await deliverOutboxBatch()).sent;
    expect(sentWhileDown).toBe(0);
    const failed = await rowsOf(c.id);
    for (const m of failed) {
      expect(m.status).toBe('pending');
      expect(m.attempts).toBe(1);
      expect(m.last_error).toBeTruthy();
      expect(new Date(m.next_attempt_at).getTime()).toBeGreaterThan(Date.now()); // backoff: not before 5 s
    }
    // A retry before the backoff ends sends nothing and costs no attempt.
    expect((await deliverOutboxBatch()).sent).toBe(0);
    expect((await rowsOf(c.id)).every((m) => m.attempts === 1)).toBe(true);

    // Another step while the server is still down: it commits; its mail waits too.
    expect((await step(DEALER, c.id, { type: 'RESUBMIT', version: await versionOf(c.id), message: 'Log attached.' })).status).toBe(200);
    expect((await claimRow(c.id)).stage).toBe('in_review');

    // Mail server back up on the same port.
    fake = await startFakeSmtp({ smtpPort: port, mailbox });
    const ours = new Set((await rowsOf(c.id)).map((m) => m.message_id));
    expect(ours.size).toBe(5);
    const until = Date.now() + 25_000;
    while (Date.now() < until) {
      // Two workers at once must not send a row twice.
      await Promise.all([drainOutbox(), drainOutbox()]);
      if ((await rowsOf(c.id)).every((m) => m.status === 'sent')) break;
      await new Promise((res) => setTimeout(res, 500));
    }
    const sent = await rowsOf(c.id);
    expect(sent.every((m) => m.status === 'sent' && m.sent_at !== null)).toBe(true);
    await drainOutbox(); // nothing doubled by a later run
    const caught = mailbox.filter((m) => m.messageId && ours.has(m.messageId));
    expect(caught.length).toBe(5);
    expect(new Set(caught.map((m) => m.messageId)).size).toBe(5);
    for (const m of sent) expect(caught.find((x) => x.messageId === m.message_id)?.to).toEqual([m.to_email]);
  }, 60_000);
});
