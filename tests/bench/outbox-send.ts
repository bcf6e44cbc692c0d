/**
 * The outbox worker's sending rate: 1,000 queued mails (the notification template, to the demo
 * users) are sent by the worker's own drain loop through nodemailer to a local SMTP fake on a
 * spare port; the fake's mailbox is then checked for every mail exactly once (by Message-ID).
 * Prints mails per second over three rounds; it never fails on time (target ≥ 200 per second).
 * Uses the bench database of tests/bench/support/review-seed.ts (created if missing; the large
 * claim seed is not needed here and is not loaded).
 *
 *   npx tsx --conditions=react-server tests/bench/outbox-send.ts
 *
 * Settings: BENCH_PG, BENCH_DATABASE (lp_review_bench), BENCH_MAILS (1000), BENCH_ROUNDS (3).
 */
import { spawn, spawnSync } from 'node:child_process';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import pg from 'pg';
import { benchUrls } from './support/review-seed';

const MAILS = Number(process.env.BENCH_MAILS ?? 1000);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 3);

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

async function main() {
  const { admin, bench, database } = benchUrls();
  const c = new pg.Client({ connectionString: admin });
  await c.connect();
  if (!(await c.query('SELECT 1 FROM pg_database WHERE datname = $1', [database])).rowCount) await c.query(`CREATE DATABASE "${database}"`);
  await c.end();
  const root = process.cwd();
  const migrated = spawnSync(path.join(root, 'node_modules/.bin/tsx'), ['--conditions=react-server', 'scripts/migrate.ts'], { cwd: root, env: { ...process.env, DATABASE_URL: bench }, encoding: 'utf8' });
  if (migrated.status !== 0) throw new Error(`migrating ${database} failed:\n${migrated.stderr}`);

  const port = await sparePort();
  // The app's own settings, pointed at the bench database and the fake; read before the modules load.
  process.env.DATABASE_URL = bench;
  process.env.SMTP_PORT = String(port);
  process.env.SMTP_HOST = '127.0.0.1';
  const { db, closeDb } = await import('@/db/connection');
  const { drainOutbox } = await import('@/lib/jobs/outbox');
  const { resetMailTransport } = await import('@/lib/mail/transport');
  const { claimUpdateMail } = await import('@/lib/mail/templates/claim-update');

  // Anything a previous run left queued is not part of this measurement.
  await db()('outbox').where({ status: 'pending' }).update({ status: 'sent', sent_at: db().fn.now(), last_error: 'left by an earlier benchmark run' });
  const people = await db()('users').select('email', 'name').orderBy('email');
  // The fake runs in its own process, as the local stack runs it, so it does not share the sender's event loop.
  const httpPort = await sparePort();
  const fake = spawn(path.join(root, 'node_modules/.bin/tsx'), ['-e', `import('./scripts/fakes/smtp.ts').then((m) => (m.startFakeSmtp ?? m.default.startFakeSmtp)({ smtpPort: ${port}, httpPort: ${httpPort} })).then(() => console.log('fake up'))`], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'inherit'],
    detached: true,
  });
  await new Promise<void>((resolve, reject) => {
    fake.stdout!.on('data', (d) => String(d).includes('fake up') && resolve());
    fake.once('exit', (code) => reject(new Error(`the SMTP fake exited (${code})`)));
  });
  const mailbox = async (): Promise<{ messageId: string | null }[]> => (await fetch(`http://127.0.0.1:${httpPort}/messages`)).json() as Promise<{ messageId: string | null }[]>;
  const clear = () => fetch(`http://127.0.0.1:${httpPort}/messages`, { method: 'DELETE' });
  console.log(`sending ${MAILS} mails per round to a local SMTP fake on port ${port}; load average ${os.loadavg().map((l) => l.toFixed(1)).join(' / ')} on ${os.cpus().length} CPUs`);
  const rates: number[] = [];
  try {
    for (let round = 1; round <= ROUNDS; round++) {
      await clear();
      const rows = Array.from({ length: MAILS }, (_, i) => {
        const p = people[i % people.length]!;
        const mail = claimUpdateMail({ name: p.name, title: `Bench update ${round}.${i}`, body: 'A claim moved on.', claimNumber: 'WC-2025-000001-0', link: 'http://127.0.0.1/claims/bench' });
        return { message_id: `<bench-${round}-${i}-${Date.now()}@loadproof.local>`, to_email: p.email, subject: mail.subject, text_body: mail.text, html_body: mail.html };
      });
      for (let i = 0; i < rows.length; i += 500) await db()('outbox').insert(rows.slice(i, i + 500));
      const ids = new Set(rows.map((r) => r.message_id));

      const t0 = performance.now();
      const cpu0 = process.cpuUsage();
      const result = await drainOutbox();
      const seconds = (performance.now() - t0) / 1000;
      const cpu = process.cpuUsage(cpu0);
      // The fake may still be parsing the last messages it accepted.
      let box = await mailbox();
      for (let i = 0; i < 50 && box.length < MAILS; i++) {
        await new Promise((r) => setTimeout(r, 100));
        box = await mailbox();
      }

      const caught = box.filter((m) => m.messageId && ids.has(m.messageId));
      const distinct = new Set(caught.map((m) => m.messageId)).size;
      const pending = Number((await db()('outbox').whereIn('message_id', [...ids]).whereNot({ status: 'sent' }).count('id as n').first())!.n);
      const rate = result.sent / seconds;
      rates.push(rate);
      console.log(
        `round ${round}: ${result.sent} sent, ${result.failed} failed in ${seconds.toFixed(2)} s = ${rate.toFixed(0)} mails/s ` +
          `(sender CPU ${((cpu.user + cpu.system) / 1000 / Math.max(1, result.sent)).toFixed(2)} ms per mail); ` +
          `caught ${caught.length}, distinct ${distinct}, duplicates ${caught.length - distinct}, missing ${MAILS - distinct}, still queued ${pending}`,
      );
      resetMailTransport(); // each round opens its connections afresh
    }
  } finally {
    resetMailTransport();
    if (fake.pid) process.kill(-fake.pid, 'SIGTERM');
    await closeDb();
  }
  rates.sort((a, b) => a - b);
  console.log(`median ${rates[Math.floor(rates.length / 2)]!.toFixed(0)} mails/s (target ≥ 200 per second, no duplicate)`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
