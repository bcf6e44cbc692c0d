// A large, self-contained data set for the review benchmarks, written with generate_series in a
// few statements (no row-by-row inserts): 100,000 claims across the demo brands and shops in every
// stage, with 10 log events each (1,000,000 events). Deterministic: the same claims every time.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import pg from 'pg';
import { initialClaimSnapshot } from '@/machines/claim';

export const BENCH_CLAIMS = 100_000;
export const EVENTS_PER_CLAIM = 10;

export function benchUrls(database = process.env.BENCH_DATABASE ?? 'lp_review_bench') {
  const server = process.env.BENCH_PG ?? 'postgres://loadproof@127.0.0.1:54329';
  return { admin: `${server}/postgres`, bench: `${server}/${database}`, database };
}

async function withClient<T>(url: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

/** Creates the bench database if needed, migrates it, loads the demo scenario, then the large seed once. */
export async function ensureReviewSeed(log: (s: string) => void = console.log): Promise<string> {
  const { admin, bench, database } = benchUrls();
  await withClient(admin, async (c) => {
    const { rowCount } = await c.query('SELECT 1 FROM pg_database WHERE datname = $1', [database]);
    if (!rowCount) {
      log(`creating database ${database}`);
      await c.query(`CREATE DATABASE "${database}"`);
    }
  });
  const root = process.cwd(); // benchmarks run from the repository root
  const migrated = spawnSync(path.join(root, 'node_modules/.bin/tsx'), ['--conditions=react-server', 'scripts/migrate.ts'], { cwd: root, env: { ...process.env, DATABASE_URL: bench }, encoding: 'utf8' });
  if (migrated.status !== 0) throw new Error(`migrating ${database} failed:\n${migrated.stderr}`);

  await withClient(bench, async (c) => {
    const { rows } = await c.query(`SELECT count(*)::int AS n FROM claims WHERE number LIKE 'WC-2025-%'`);
    if (rows[0].n >= BENCH_CLAIMS) {
      log(`${database}: ${rows[0].n} seeded claims present`);
      return;
    }
    const started = Date.now();
    const template = initialClaimSnapshot({ openedBy: { id: '00000000-0000-0000-0000-000000000000', role: 'dealer' }, openedAt: '2026-01-01T00:00:00Z' }).context;
    await c.query('BEGIN');
    await c.query(
      `
      WITH acc AS (
        SELECT row_number() OVER (ORDER BY a.account_number) AS rn, a.id, a.dealer_id, a.brand_id,
               (SELECT u.id FROM users u WHERE u.organisation_id = a.dealer_id AND u.role = 'dealer' ORDER BY u.email LIMIT 1) AS uid
        FROM dealer_accounts a),
      prt AS (SELECT brand_id, array_agg(id ORDER BY part_number) AS ids, array_agg(category ORDER BY part_number) AS cats, array_agg(part_number ORDER BY part_number) AS nums
              FROM parts WHERE category IN ('drive_unit', 'battery', 'controller', 'display') GROUP BY brand_id),
      rep AS (SELECT organisation_id AS brand_id, array_agg(id ORDER BY email) AS ids FROM users WHERE role = 'brand_rep' GROUP BY organisation_id),
      gen AS (
        SELECT g, abs(hashtext('s' || g)) % 100 AS s, abs(hashtext('p' || g)) AS ph, abs(hashtext('t' || g)) AS th,
               -- 7 in 10 claims go to the brand first by name (Torvane in the demo; its rep is the one measured)
               CASE WHEN g % 10 < 7 THEN 0 ELSE 1 END AS b
        FROM generate_series(1, $1::int) g),
      brands AS (SELECT o.id AS brand_id, row_number() OVER (ORDER BY o.name) - 1 AS bi FROM organisations o WHERE o.kind = 'brand' AND EXISTS (SELECT 1 FROM dealer_accounts a WHERE a.brand_id = o.id)),
      rows AS (
        SELECT gen.*, acc.id AS account_id, acc.dealer_id, acc.brand_id, acc.uid, prt.ids AS part_ids, prt.cats, prt.nums, rep.ids AS rep_ids,
               CASE WHEN s < 10 THEN 'submitted' WHEN s < 25 THEN 'in_review' WHEN s < 32 THEN 'waiting_on_dealer' WHEN s < 34 THEN 'appealed'
                    WHEN s < 60 THEN 'approved' WHEN s < 70 THEN 'denied' WHEN s < 75 THEN 'withdrawn' WHEN s < 90 THEN 'credited' ELSE 'reconciled' END AS stage,
               1 + ph % array_length(prt.ids, 1) AS pi
        FROM gen
        JOIN brands ON brands.bi = gen.b
        JOIN LATERAL (SELECT * FROM acc WHERE acc.brand_id = brands.brand_id ORDER BY rn OFFSET (gen.g % 3) LIMIT 1) acc ON true
        JOIN prt ON prt.brand_id = acc.brand_id
        JOIN rep ON rep.brand_id = acc.brand_id),
      timed AS (
        SELECT rows.*,
               -- open claims were submitted within the last 20 days, decided ones within the last year
               now() - make_interval(secs => (th % (CASE WHEN stage IN ('submitted', 'in_review', 'waiting_on_dealer', 'appealed') THEN 20 ELSE 365 END * 86400))) AS sub_at
        FROM rows)
      INSERT INTO claims (number, dealer_id, brand_id, dealer_account_id, frame_serial, part_id, part_category, part_serial, failure_date, symptom,
                          requested_lines, state_value, context, version, review_due_on, review_started_at, created_by, created_at, updated_at, submitted_at)
      SELECT 'WC-2025-' || lpad(g::text, 6, '0') || '-0', dealer_id, brand_id, account_id, 'BF-' || lpad((g % 40000)::text, 6, '0'),
             part_ids[pi], cats[pi], 'PS-' || lpad((g % 60000)::text, 6, '0'), (sub_at - interval '3 days')::date, 'Bench claim',
             jsonb_build_object('parts', jsonb_build_array(jsonb_build_object('lineId', 'p1', 'partId', part_ids[pi], 'partNumber', nums[pi], 'name', nums[pi], 'quantity', 1, 'fromDealerStock', false)), 'labor', '[]'::jsonb, 'freightMinor', 0),
             CASE WHEN stage = 'approved' THEN '{"approved":{"replacement":"to_ship","core":"requested"}}'::jsonb ELSE to_jsonb(stage) END,
             $2::jsonb || jsonb_build_object(
               'openedBy', jsonb_build_object('id', uid, 'role', 'dealer'),
               'submittedAt', to_jsonb(sub_at),
               'assignedRepId', CASE WHEN stage IN ('in_review', 'waiting_on_dealer') THEN to_jsonb(rep_ids[1 + g % array_length(rep_ids, 1)]) ELSE 'null'::jsonb END,
               'appealsUsed', CASE WHEN stage = 'appealed' THEN 1 ELSE 0 END,
               'deniedByRepId', CASE WHEN stage = 'appealed' THEN to_jsonb(rep_ids[1]) ELSE 'null'::jsonb END),
             3,
             CASE WHEN stage IN ('submitted', 'in_review', 'appealed') THEN (sub_at + make_interval(days => 7))::date END,
             sub_at, uid, sub_at - interval '1 hour', sub_at + interval '1 hour', sub_at
      FROM timed`,
      [BENCH_CLAIMS, JSON.stringify(template)],
    );
    log(`${database}: ${BENCH_CLAIMS} claims in ${((Date.now() - started) / 1000).toFixed(1)} s`);
    const evStarted = Date.now();
    await c.query(
      `INSERT INTO claim_events (claim_id, actor_id, actor_role, event, from_state, to_state, payload, created_at)
       SELECT c.id, c.created_by, 'dealer',
              CASE WHEN k = 1 THEN 'OPENED' WHEN k <= 6 THEN 'EVIDENCE_ADDED' WHEN k = 7 THEN 'SUBMIT' WHEN k = 8 THEN 'TAKE'
                   WHEN k = 10 AND c.stage = 'waiting_on_dealer' THEN 'REQUEST_INFO' ELSE 'MESSAGE' END,
              NULL, NULL, jsonb_build_object('message', 'bench'), c.submitted_at + make_interval(mins => k)
       FROM claims c CROSS JOIN generate_series(1, $1::int) k
       WHERE c.number LIKE 'WC-2025-%'`,
      [EVENTS_PER_CLAIM],
    );
    await c.query('COMMIT');
    log(`${database}: ${BENCH_CLAIMS * EVENTS_PER_CLAIM} events in ${((Date.now() - evStarted) / 1000).toFixed(1)} s`);
    await c.query('VACUUM ANALYZE claims');
    await c.query('VACUUM ANALYZE claim_events');
  });
  return bench;
}
