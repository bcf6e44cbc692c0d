/**
 * The review queue route under load: GET /api/review as the demo rep, 20 requests in flight at a
 * time, over a mix of the queue's filters and sorts, against 100,000 claims and 1,000,000 log
 * events (tests/bench/support/review-seed.ts, in its own database). Prints p50 / p95 / p99 per
 * query and overall; it never fails on time (target: p95 ≤ 50 ms).
 *
 * What is measured is the real route: a production build of this checkout (`npx next build`
 * first) started on BENCH_PORT against the bench database, signed in through next-auth's
 * credentials endpoint, loaded over HTTP. For comparison the same page is then computed
 * in-process (the queue service straight on the database, no HTTP, no session).
 *
 *   npx next build && npx tsx --conditions=react-server tests/bench/review-queue.ts
 *
 * Settings: BENCH_PG (server URL, default the local cluster), BENCH_DATABASE (lp_review_bench),
 * BENCH_PORT (3211), BENCH_REQUESTS (2000), BENCH_CONCURRENCY (20).
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { ensureReviewSeed } from './support/review-seed';

const PORT = Number(process.env.BENCH_PORT ?? 3211);
const REQUESTS = Number(process.env.BENCH_REQUESTS ?? 2000);
const CONCURRENCY = Number(process.env.BENCH_CONCURRENCY ?? 20);
const REP = 'priya.nair@torvane.test';
const root = process.cwd(); // run from the repository root
const base = `http://127.0.0.1:${PORT}`;

/** The queue as reps use it: the default view first, then each filter and sort. */
const QUERIES: Record<string, Record<string, string>> = {
  'open, by deadline': {},
  'needs a rep': { view: 'needs_rep' },
  'assigned to me': { view: 'in_review', assigned: 'me' },
  'one dealer': { dealer: '__dealer__' },
  'batteries': { category: 'battery' },
  'overdue': { deadline: 'overdue' },
  'due within 2 days': { deadline: 'due_soon' },
  'age 8–30 days': { age: '8-30' },
  'page 20, by age': { page: '20', sort: 'age', dir: 'desc' },
  'decided, latest first': { view: 'decided' },
};

function quantile(sorted: number[], q: number): number {
  if (!sorted.length) return Number.NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[i]!;
}
const ms = (n: number) => `${n.toFixed(1).padStart(7)} ms`;

async function waitForServer(url: string, timeoutMs = 30_000) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    try {
      await fetch(url);
      return;
    } catch {
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  throw new Error(`the app did not answer at ${url}`);
}

/** Signs in through next-auth's own credentials endpoint and returns the session cookie. */
async function signIn(email: string): Promise<string> {
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const jar = csrfRes.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const res = await fetch(`${base}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar },
    body: new URLSearchParams({ csrfToken, email, password: 'loadproof-demo', json: 'true' }),
  });
  const session = res.headers.getSetCookie().map((c) => c.split(';')[0]).find((c) => c?.startsWith('next-auth.session-token='));
  if (!session) throw new Error(`signing in as ${email} failed (${res.status})`);
  return session;
}

async function main() {
  if (!fs.existsSync(path.join(root, '.next/BUILD_ID'))) throw new Error('No production build here: run `npx next build` first.');
  const benchUrl = await ensureReviewSeed();
  process.env.DATABASE_URL = benchUrl;

  const { db, closeDb } = await import('@/db/connection');
  const dealerId = (await db()('organisations').where({ slug: 'lanternhill' }).first('id')).id as string;
  const counts = await db()('claims as c').join('users as u', 'u.organisation_id', 'c.brand_id').where('u.email', REP).count<{ n: string }[]>('c.id as n').first();
  const events = await db()('claim_events').count<{ n: string }[]>('id as n').first();
  console.log(`bench data: ${Number((await db()('claims').count('id as n').first())!.n)} claims (${counts?.n} against the rep's brand), ${events?.n} events`);

  const app = spawn(path.join(root, 'node_modules/.bin/next'), ['start', '-H', '127.0.0.1', '-p', String(PORT)], {
    cwd: root,
    env: { ...process.env, DATABASE_URL: benchUrl, APP_URL: base, NEXTAUTH_URL: base },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  let appLog = '';
  app.stdout.on('data', (d) => (appLog += d));
  app.stderr.on('data', (d) => (appLog += d));
  try {
    await waitForServer(`${base}/signin`);
    const cookie = await signIn(REP);
    const url = (q: Record<string, string>) => {
      const params = new URLSearchParams(Object.entries(q).map(([k, v]) => [k, v === '__dealer__' ? dealerId : v]));
      return `${base}/api/review?${params}`;
    };
    const names = Object.keys(QUERIES);
    const get = async (name: string) => {
      const t0 = performance.now();
      const res = await fetch(url(QUERIES[name]!), { headers: { cookie } });
      const body = await res.text();
      const t = performance.now() - t0;
      if (!res.ok) throw new Error(`${name}: ${res.status} ${body.slice(0, 200)}`);
      return t;
    };

    // Warm-up: compile routes, fill the pools and caches.
    for (let i = 0; i < 60; i++) await get(names[i % names.length]!);

    // The floor on this machine right now: next-auth's own session route (cookie decoded, no query), same load.
    const floor: number[] = [];
    let k = 0;
    await Promise.all(
      Array.from({ length: CONCURRENCY }, async () => {
        while (k++ < REQUESTS / 4) {
          const t = performance.now();
          await (await fetch(`${base}/api/auth/session`, { headers: { cookie } })).text();
          floor.push(performance.now() - t);
        }
      }),
    );
    floor.sort((a, b) => a - b);

    const samples: Record<string, number[]> = Object.fromEntries(names.map((n) => [n, []]));
    let next = 0;
    const t0 = performance.now();
    await Promise.all(
      Array.from({ length: CONCURRENCY }, async () => {
        for (;;) {
          const i = next++;
          if (i >= REQUESTS) return;
          const name = names[i % names.length]!;
          samples[name]!.push(await get(name));
        }
      }),
    );
    const seconds = (performance.now() - t0) / 1000;

    console.log(`\nGET /api/review over HTTP: ${REQUESTS} requests, ${CONCURRENCY} in flight, ${(REQUESTS / seconds).toFixed(0)} requests/s`);
    // The machine may be shared: the load average says how much the figures can be trusted.
    console.log(`load average during the run: ${os.loadavg().map((l) => l.toFixed(1)).join(' / ')} on ${os.cpus().length} CPUs`);
    console.log(`${'query'.padEnd(22)} ${'n'.padStart(5)} ${'p50'.padStart(10)} ${'p95'.padStart(10)} ${'p99'.padStart(10)}`);
    const all: number[] = [];
    for (const name of names) {
      const s = samples[name]!.sort((a, b) => a - b);
      all.push(...s);
      console.log(`${name.padEnd(22)} ${String(s.length).padStart(5)} ${ms(quantile(s, 0.5))} ${ms(quantile(s, 0.95))} ${ms(quantile(s, 0.99))}`);
    }
    all.sort((a, b) => a - b);
    console.log(`${'all'.padEnd(22)} ${String(all.length).padStart(5)} ${ms(quantile(all, 0.5))} ${ms(quantile(all, 0.95))} ${ms(quantile(all, 0.99))}   (target p95 ≤ 50 ms)`);
    console.log(`${'floor: /api/auth/session'.padEnd(22)} ${String(floor.length).padStart(5)} ${ms(quantile(floor, 0.5))} ${ms(quantile(floor, 0.95))} ${ms(quantile(floor, 0.99))}   (no query: what the server and machine cost alone)`);
  } finally {
    if (app.pid) process.kill(-app.pid, 'SIGTERM');
  }

  // The same pages computed in-process, one at a time: what the database and the service cost without HTTP.
  const { reviewQueue } = await import('@/lib/services/review-queue');
  const { findActiveUser } = await import('@/lib/db/users');
  const { reviewQueueQuerySchema } = await import('@/lib/validation/review');
  const repId = (await db()('users').where({ email: REP }).first('id')).id as string;
  const user = (await findActiveUser(repId))!;
  console.log(`\nthe queue service in-process (no HTTP), 20 runs each, one at a time`);
  for (const [name, q] of Object.entries(QUERIES)) {
    const query = reviewQueueQuerySchema.parse(Object.fromEntries(Object.entries(q).map(([k, v]) => [k, v === '__dealer__' ? dealerId : v])));
    const times: number[] = [];
    for (let i = 0; i < 20; i++) {
      const t = performance.now();
      await reviewQueue(user, query);
      times.push(performance.now() - t);
    }
    times.sort((a, b) => a - b);
    console.log(`${name.padEnd(22)} p50 ${ms(quantile(times, 0.5))}  p95 ${ms(quantile(times, 0.95))}`);
  }
  await closeDb();
  if (process.env.BENCH_VERBOSE) console.log(appLog);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
