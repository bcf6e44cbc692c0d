/**
 * The dealer claims list under load: 100,000 claims and 1,000,000 events, 20 concurrent
 * connections, filter + sort + a page of 50. Prints figures; never fails on time.
 *
 *   npx tsx tests/bench/claims-list.ts            (add --reseed to rebuild the bench database)
 *
 * How it measures, so the two figures are comparable:
 * - A dedicated database (BENCH_DATABASE_URL, default `loadproof_bench_claims` on the server of
 *   DATABASE_URL; the demo and test databases are refused) gets the migrations and the demo
 *   scenario, then 100,000 claims spread over the demo's 3 shops × 2 brands and 10 events each,
 *   written by INSERT … SELECT over generate_series (no row-by-row inserts), then ANALYZE.
 * - The real route: the production build (`next build`, run first if `.next` has none) is started
 *   with `next start` against the bench database; the load generator signs in as a demo dealer
 *   through next-auth's credentials endpoint (csrf token, then callback) and calls
 *   GET /api/claims over HTTP with that session cookie. Each request therefore pays what a real
 *   one pays: JWT session check, the user's row read fresh, zod parsing, the count and page queries,
 *   JSON.
 * - The baseline: a bare node:http server (a separate process, like the app) runs the very same
 *   statements through pg with a pool of the app's size (10): the SQL and bindings are captured
 *   from lib/db/claim-list.ts itself (claims-list-sql.ts), not written a second time.
 * - Both are loaded alike: keep-alive agent, 20 requests in flight, the shapes of
 *   claims-list-shapes.ts in turn, a warm-up, then the measured requests; the two servers take
 *   turns, twice, and the last round of each is compared. Results of both are checked equal first.
 *
 * Indexes the dealer list relies on (db/migrations/20261201000400_claims.ts):
 *   claims_dealer_updated       (dealer_id, updated_at DESC, id DESC)        — no filter, newest first
 *   claims_dealer_stage_updated (dealer_id, stage, updated_at DESC, id DESC) — a stage filter; also the count
 * The EXPLAIN of every shape is printed below the figures, with the indexes each plan uses.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { COUNT_CAP } from '../../lib/paging';
import fs from 'node:fs';
import os from 'node:os';
import http from 'node:http';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import pg from 'pg';
import { SHAPES } from './claims-list-shapes';

const ROOT = process.cwd();
const OUT = path.join(ROOT, 'tests/bench/out');
const SQL_FILE = path.join(OUT, 'claims-list-sql.json');
const DEALER_EMAIL = 'lena.hartmann@kettenblatt.test';
const DEMO_PASSWORD = 'loadproof-demo';
const CLAIMS = 100_000;
const EVENTS_PER_CLAIM = 10;
const CONCURRENCY = Number(process.env.BENCH_CONCURRENCY ?? 20);
const REQUESTS = Number(process.env.BENCH_REQUESTS ?? 2000);
const WARMUP = Number(process.env.BENCH_WARMUP ?? 300);
const APP_PORT = Number(process.env.BENCH_APP_PORT ?? 3290);
// The bare server takes any free port unless told one.
const BARE_PORT = Number(process.env.BENCH_BARE_PORT ?? 0);
const APP_POOL_SIZE = 10; // knexfile.ts pool.max

function benchDatabaseUrl(): string {
  if (process.env.BENCH_DATABASE_URL) return process.env.BENCH_DATABASE_URL;
  const u = new URL(process.env.DATABASE_URL ?? 'postgres://loadproof@127.0.0.1:54329/loadproof');
  u.pathname = '/loadproof_bench_claims';
  return u.toString();
}

const dbName = (url: string) => decodeURIComponent(new URL(url).pathname.slice(1));

// Same parsers as db/connection.ts, so the bare server returns what the route returns.
pg.types.setTypeParser(1082, (v) => v);
pg.types.setTypeParser(20, (v) => Number(v));

// ——— The bare server (this file run with --bare <port>).

async function serveBare(port: number, url: string) {
  const shapes = JSON.parse(fs.readFileSync(SQL_FILE, 'utf8')) as { queries: { sql: string; bindings: unknown[] }[] }[];
  const pool = new pg.Pool({ connectionString: url, max: APP_POOL_SIZE });
  http
    .createServer(async (req, res) => {
      try {
        const shape = shapes[Number(new URL(req.url ?? '/', 'http://x').searchParams.get('shape'))];
        if (!shape) throw new Error('unknown shape');
        const results = await Promise.all(shape.queries.map((q) => pool.query(q.sql, q.bindings)));
        // The capped count (lib/db/paging.ts) is the one single-column result named n.
        const countResult = results.find((r) => r.fields.length === 1 && r.fields[0]!.name === 'n')!;
        const rowsResult = results.find((r) => r !== countResult)!;
        const counted = Number(countResult.rows[0]?.n ?? 0);
        const body = JSON.stringify({
          total: Math.min(counted, COUNT_CAP),
          totalCapped: counted > COUNT_CAP,
          rows: rowsResult.rows.map((r) => ({ ...r, createdAt: new Date(r.createdAt).toISOString(), updatedAt: new Date(r.updatedAt).toISOString() })),
        });
        res.writeHead(200, { 'content-type': 'application/json' });
        res.end(body);
      } catch (e) {
        res.writeHead(500);
        res.end(String(e));
      }
    })
    .listen(port, '127.0.0.1', function (this: http.Server) {
      console.log(`bare server ready on ${(this.address() as { port: number }).port}`);
    });
}

// ——— Database.

async function ensureDatabase(url: string, reseed: boolean) {
  const name = dbName(url);
  if (['loadproof', 'loadproof_test'].includes(name)) throw new Error(`refusing to seed ${name}: give the benchmark its own database`);
  const admin = new URL(url);
  admin.pathname = '/postgres';
  const c = new pg.Client({ connectionString: admin.toString() });
  await c.connect();
  if (reseed) await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  const exists = (await c.query('SELECT 1 FROM pg_database WHERE datname = $1', [name])).rowCount === 1;
  if (!exists) await c.query(`CREATE DATABASE "${name}"`);
  await c.end();
  const r = spawnSync('npx', ['tsx', '--conditions=react-server', 'scripts/migrate.ts'], { cwd: ROOT, env: { ...process.env, DATABASE_URL: url }, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`migrate failed:\n${r.stderr}`);
  console.log(`  ${r.stdout.trim().split('\n').join('; ')}`);
}

const SEED_CLAIMS = `
WITH acc AS (
  SELECT a.id AS account_id, a.dealer_id, a.brand_id, (row_number() OVER (ORDER BY a.dealer_id, a.brand_id) - 1)::int AS k
  FROM dealer_accounts a
), creators AS (
  SELECT DISTINCT ON (organisation_id) organisation_id, id FROM users WHERE org_kind = 'dealer' ORDER BY organisation_id, email
), bm AS (
  SELECT brand_id, array_agg(id ORDER BY code) AS ids FROM bike_models GROUP BY brand_id
), bp AS (
  SELECT brand_id, array_agg(id ORDER BY part_number) AS ids, array_agg(category ORDER BY part_number) AS cats FROM parts GROUP BY brand_id
), states AS (
  -- Weighted like a shop's history: most claims finished, a few in each open stage.
  SELECT array['"draft"', '"submitted"', '"in_review"', '"in_review"', '"waiting_on_dealer"', '"denied"', '"withdrawn"',
    '{"approved":{"replacement":"shipped","core":"core_in_transit"}}', '{"approved":{"replacement":"fitted","core":"core_received"}}',
    '"credit_pending"', '"credited"', '"credited"', '"reconciled"', '"reconciled"', '"reconciled"']::jsonb[] AS s
), g AS (
  SELECT n, abs(hashint4(n)::bigint) AS h1, abs(hashint4(n * 3 + 1)::bigint) AS h2, abs(hashint4(n * 7 + 2)::bigint) AS h3 FROM generate_series(1, $1::int) AS n
)
INSERT INTO claims (number, dealer_id, brand_id, dealer_account_id, model_id, frame_serial, part_id, part_category, part_serial,
  sale_date, failure_date, symptom, customer_name, state_value, context, version, created_by, created_at, updated_at, submitted_at)
SELECT 'BENCH-' || lpad(g.n::text, 7, '0'), acc.dealer_id, acc.brand_id, acc.account_id,
  bm.ids[1 + g.h1 % array_length(bm.ids, 1)], 'BF' || lpad(g.n::text, 8, '0'),
  bp.ids[1 + g.h2 % array_length(bp.ids, 1)], bp.cats[1 + g.h2 % array_length(bp.ids, 1)], 'PS' || g.n,
  current_date - (g.h3 % 700 + 120 + g.n % 300)::int, current_date - (g.h3 % 700)::int, 'Bench symptom', 'Rider ' || (g.n % 5000),
  states.s[1 + g.h1 % 15], '{}'::jsonb, 1 + g.n % 5, creators.id,
  now() - (g.h2 % (730 * 1440)) * interval '1 minute' - interval '3 days',
  now() - (g.h2 % (730 * 1440)) * interval '1 minute' + (g.h3 % 4000) * interval '1 minute' - interval '3 days',
  now() - (g.h2 % (730 * 1440)) * interval '1 minute'
FROM g
JOIN acc ON acc.k = g.n % (SELECT count(*) FROM acc)
JOIN creators ON creators.organisation_id = acc.dealer_id
JOIN bm ON bm.brand_id = acc.brand_id
JOIN bp ON bp.brand_id = acc.brand_id
CROSS JOIN states`;

const SEED_EVENTS = `
INSERT INTO claim_events (claim_id, actor_id, actor_role, event, from_state, to_state, payload, created_at)
SELECT c.id, c.created_by, 'dealer',
  (array['OPENED', 'EVIDENCE_ADDED', 'EVIDENCE_ADDED', 'EVIDENCE_ADDED', 'SUBMIT', 'TAKE', 'MESSAGE', 'APPROVE', 'SHIP', 'FIT'])[s],
  '"draft"'::jsonb, '"submitted"'::jsonb, jsonb_build_object('n', s), c.created_at + s * interval '17 minutes'
FROM claims c CROSS JOIN generate_series(1, $1::int) AS s
WHERE c.number LIKE 'BENCH-%'`;

async function seed(url: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const have = Number((await c.query(`SELECT count(*) FROM claims WHERE number LIKE 'BENCH-%'`)).rows[0].count);
  if (have >= CLAIMS) {
    console.log(`  ${have.toLocaleString('en-GB')} bench claims already there (--reseed to start over)`);
  } else {
    if (have > 0) throw new Error('the bench database is half seeded; run with --reseed');
    let t = performance.now();
    await c.query(SEED_CLAIMS, [CLAIMS]);
    console.log(`  ${CLAIMS.toLocaleString('en-GB')} claims in ${((performance.now() - t) / 1000).toFixed(1)} s`);
    t = performance.now();
    await c.query(SEED_EVENTS, [EVENTS_PER_CLAIM]);
    console.log(`  ${(CLAIMS * EVENTS_PER_CLAIM).toLocaleString('en-GB')} events in ${((performance.now() - t) / 1000).toFixed(1)} s`);
  }
  // What autovacuum does after a bulk load: statistics, and a visibility map for index-only counts.
  for (const t of ['claims', 'claim_events', 'organisations', 'bike_models', 'parts', 'users']) await c.query(`VACUUM (ANALYZE) ${t}`);
  const counts = (await c.query(`SELECT (SELECT count(*) FROM claims) AS claims, (SELECT count(*) FROM claim_events) AS events`)).rows[0];
  console.log(`  database holds ${Number(counts.claims).toLocaleString('en-GB')} claims and ${Number(counts.events).toLocaleString('en-GB')} events`);
  await c.end();
}

// ——— Servers.

const children: ChildProcess[] = [];

function start(cmd: string, args: string[], env: Record<string, string>, ready: RegExp, name: string): Promise<{ child: ChildProcess; log: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd: ROOT, env: { ...process.env, ...env }, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
    children.push(child);
    let log = '';
    const onData = (d: Buffer) => {
      log += d.toString();
      if (ready.test(log)) resolve({ child, log });
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (d: Buffer) => (log += d.toString()));
    child.on('exit', (code) => reject(new Error(`${name} exited (${code}):\n${log}`)));
    setTimeout(() => reject(new Error(`${name} did not start:\n${log}`)), 60_000).unref();
  });
}

function stopAll() {
  for (const c of children) {
    try {
      if (c.pid) process.kill(-c.pid, 'SIGTERM');
    } catch {
      // already gone
    }
  }
}

// ——— HTTP client.

const agent = new http.Agent({ keepAlive: true, maxSockets: CONCURRENCY });

function get(url: string, headers: Record<string, string> = {}): Promise<{ status: number; body: string; headers: http.IncomingHttpHeaders }> {
  return new Promise((resolve, reject) => {
    const req = http.get(url, { agent, headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString(), headers: res.headers }));
    });
    req.on('error', reject);
  });
}

function post(url: string, body: string, headers: Record<string, string>) {
  return new Promise<{ status: number; headers: http.IncomingHttpHeaders }>((resolve, reject) => {
    const req = http.request(url, { method: 'POST', agent, headers: { ...headers, 'content-length': Buffer.byteLength(body).toString() } }, (res) => {
      res.resume();
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers }));
    });
    req.on('error', reject);
    req.end(body);
  });
}

const cookiesOf = (h: http.IncomingHttpHeaders) => (h['set-cookie'] ?? []).map((c) => c.split(';')[0]!);

/** Signs in the way the browser does: csrf token, then the credentials callback. */
async function signIn(base: string): Promise<string> {
  const csrf = await get(`${base}/api/auth/csrf`);
  const token = JSON.parse(csrf.body).csrfToken as string;
  const jar = cookiesOf(csrf.headers);
  const form = new URLSearchParams({ csrfToken: token, email: DEALER_EMAIL, password: DEMO_PASSWORD, json: 'true', callbackUrl: `${base}/claims` });
  const r = await post(`${base}/api/auth/callback/credentials`, form.toString(), { 'content-type': 'application/x-www-form-urlencoded', cookie: jar.join('; ') });
  const session = cookiesOf(r.headers).find((c) => c.startsWith('next-auth.session-token='));
  if (!session) throw new Error(`sign-in failed (${r.status})`);
  return session;
}

// ——— Load.

type Result = { name: string; n: number; p50: number; p95: number; p99: number; mean: number; perSecond: number; errors: number };

const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)]!;

async function load(name: string, urlOf: (i: number) => string, headers: Record<string, string>): Promise<Result> {
  const run = async (total: number) => {
    const times: number[] = [];
    let next = 0;
    let errors = 0;
    const worker = async () => {
      while (next < total) {
        const i = next++;
        const t = performance.now();
        const r = await get(urlOf(i), headers);
        times.push(performance.now() - t);
        if (r.status !== 200) errors++;
      }
    };
    const t0 = performance.now();
    await Promise.all(Array.from({ length: CONCURRENCY }, worker));
    return { times, errors, seconds: (performance.now() - t0) / 1000 };
  };
  await run(WARMUP);
  const { times, errors, seconds } = await run(REQUESTS);
  const sorted = [...times].sort((a, b) => a - b);
  return {
    name, n: times.length, p50: quantile(sorted, 0.5), p95: quantile(sorted, 0.95), p99: quantile(sorted, 0.99),
    mean: times.reduce((a, b) => a + b, 0) / times.length, perSecond: times.length / seconds, errors,
  };
}

const ms = (v: number) => `${v.toFixed(1).padStart(7)} ms`;
function print(r: Result) {
  console.log(`  ${r.name.padEnd(34)} p50 ${ms(r.p50)}  p95 ${ms(r.p95)}  p99 ${ms(r.p99)}  mean ${ms(r.mean)}  ${r.perSecond.toFixed(0).padStart(5)} req/s  ${r.errors ? `${r.errors} errors` : ''}`);
}

// ——— Plans.

type PlanNode = { 'Node Type': string; 'Index Name'?: string; 'Relation Name'?: string; Plans?: PlanNode[] };
function planIndexes(n: PlanNode, out = new Set<string>()): Set<string> {
  if (n['Index Name']) out.add(n['Index Name']);
  else if (n['Node Type'] === 'Seq Scan' && n['Relation Name']) out.add(`seq scan on ${n['Relation Name']}`);
  for (const c of n.Plans ?? []) planIndexes(c, out);
  return out;
}

async function explain(url: string, shapes: { name: string; queries: { sql: string; bindings: unknown[] }[] }[]) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  console.log('\nPlans (EXPLAIN ANALYZE of the route\'s own statements):');
  for (const s of shapes) {
    const parts: string[] = [];
    for (const q of s.queries) {
      const r = await c.query(`EXPLAIN (ANALYZE, FORMAT JSON) ${q.sql}`, q.bindings);
      const plan = r.rows[0]['QUERY PLAN'][0];
      const kind = /^select count/i.test(q.sql) ? 'count' : 'page';
      parts.push(`${kind} ${plan['Execution Time'].toFixed(2)} ms [${[...planIndexes(plan.Plan)].join(', ')}]`);
    }
    console.log(`  ${s.name.padEnd(40)} ${parts.join('; ')}`);
  }
  await c.end();
}

// ——— Main.

async function main() {
  const url = benchDatabaseUrl();
  if (process.argv[2] === '--bare') return serveBare(Number(process.argv[3]), url);
  fs.mkdirSync(OUT, { recursive: true });
  process.on('exit', stopAll);
  process.on('SIGINT', () => process.exit(130));

  console.log(`Claims list benchmark — database ${dbName(url)}, ${CONCURRENCY} connections, ${REQUESTS} measured requests (+${WARMUP} warm-up) per round`);
  console.log('Preparing the database:');
  await ensureDatabase(url, process.argv.includes('--reseed'));
  await seed(url);

  const captured = spawnSync('npx', ['tsx', '--conditions=react-server', 'tests/bench/claims-list-sql.ts', DEALER_EMAIL], {
    cwd: ROOT, env: { ...process.env, DATABASE_URL: url }, encoding: 'utf8',
  });
  if (captured.status !== 0) throw new Error(`could not capture the route's SQL:\n${captured.stderr}`);
  fs.writeFileSync(SQL_FILE, captured.stdout);
  const shapes = JSON.parse(captured.stdout) as { name: string; query: string; queries: { sql: string; bindings: unknown[] }[] }[];

  if (!fs.existsSync(path.join(ROOT, '.next/BUILD_ID'))) {
    console.log('No production build yet: running next build …');
    const b = spawnSync('npx', ['next', 'build'], { cwd: ROOT, stdio: 'inherit' });
    if (b.status !== 0) throw new Error('next build failed');
  }
  const base = `http://127.0.0.1:${APP_PORT}`;
  await start('npx', ['next', 'start', '-H', '127.0.0.1', '-p', String(APP_PORT)], { DATABASE_URL: url, APP_URL: base, NEXTAUTH_URL: base }, /Ready in|started server/i, 'next start');
  const bareServer = await start('npx', ['tsx', 'tests/bench/claims-list.ts', '--bare', String(BARE_PORT)], { BENCH_DATABASE_URL: url }, /bare server ready on \d+/, 'bare server');
  const bare = `http://127.0.0.1:${/ready on (\d+)/.exec(bareServer.log)![1]}`;
  const cookie = await signIn(base);
  const headers = { cookie };

  // Same SQL, same answers: check before timing anything.
  for (const [i, s] of shapes.entries()) {
    const a = await get(`${base}/api/claims?${s.query}`, headers);
    const b = await get(`${bare}/list?shape=${i}`);
    if (a.status !== 200) throw new Error(`route answered ${a.status} for ${s.query}: ${a.body.slice(0, 200)}`);
    const ra = JSON.parse(a.body);
    const rb = JSON.parse(b.body);
    if (ra.total !== rb.total || ra.rows.map((r: { id: string }) => r.id).join() !== rb.rows.map((r: { id: string }) => r.id).join()) {
      throw new Error(`route and bare server disagree on ${s.name}`);
    }
    console.log(`  ${s.name.padEnd(40)} ${String(ra.total).padStart(6)} claims, ${ra.rows.length} on the page`);
  }

  const results: Result[] = [];
  for (const round of [1, 2]) {
    console.log(`\nRound ${round}:`);
    const b = await load(`bare pg server (round ${round})`, (i) => `${bare}/list?shape=${i % shapes.length}`, {});
    print(b);
    const r = await load(`GET /api/claims (round ${round})`, (i) => `${base}/api/claims?${shapes[i % shapes.length]!.query}`, headers);
    print(r);
    results.push(b, r);
  }
  const [bareLast, routeLast] = results.slice(-2) as [Result, Result];
  // Latency at 20 in flight is mostly queueing for CPU: say how busy the machine was.
  console.log(`\nResult (last round; ${os.cpus().length} CPUs, load average ${os.loadavg().map((l) => l.toFixed(1)).join(' / ')} over 1 / 5 / 15 min):`);
  console.log(`  route p95 ${routeLast.p95.toFixed(1)} ms (target ≤ 50 ms) — ${routeLast.p95 <= 50 ? 'within' : 'OVER'} target`);
  console.log(`  bare  p95 ${bareLast.p95.toFixed(1)} ms`);
  console.log(`  ratio route / bare = ${(routeLast.p95 / bareLast.p95).toFixed(2)}× (target ≤ 2×) — ${routeLast.p95 <= 2 * bareLast.p95 ? 'within' : 'OVER'} target`);
  await explain(url, shapes);
  stopAll();
  process.exit(0);
}

main().catch((e) => {
  console.error(e);
  stopAll();
  process.exit(1);
});
