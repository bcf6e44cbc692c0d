// The background worker: sends queued mail (woken at once by NOTIFY on the outbox, and
// polling as a fallback) and runs the clock-driven jobs in lib/jobs/registry.ts.
// Run with the react-server condition so `server-only` modules load outside Next.js.
import pg from 'pg';
import { closeDb } from '../db/connection';
import { env } from '../lib/env';
import { jobs } from '../lib/jobs/registry';

const running = new Set<string>();
// A wake-up (NOTIFY) that arrives while the job runs is kept and run right after, not dropped.
const again = new Set<string>();
let stopping = false;

async function runJob(name: string) {
  const job = jobs.find((j) => j.name === name);
  if (!job || stopping) return;
  if (running.has(name)) {
    again.add(name);
    return;
  }
  running.add(name);
  try {
    do {
      again.delete(name);
      await job.run();
    } while (again.has(name) && !stopping);
  } catch (err) {
    console.error(`[worker] ${name} failed:`, (err as Error).message);
  } finally {
    running.delete(name);
  }
}

async function main() {
  const timers = jobs.map((j) => setInterval(() => void runJob(j.name), j.everyMs));
  const listener = new pg.Client({ connectionString: env().DATABASE_URL });
  await listener.connect();
  await listener.query('LISTEN outbox');
  listener.on('notification', () => void runJob('outbox'));
  for (const j of jobs) void runJob(j.name);
  console.log('worker ready');

  const stop = async () => {
    stopping = true;
    timers.forEach(clearInterval);
    await listener.end().catch(() => {});
    await closeDb();
    process.exit(0);
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
