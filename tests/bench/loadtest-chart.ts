/**
 * Benchmark: the claim page of a typical dyno run in headless Chromium. Prints how long the
 * overlay chart takes to be drawn after navigation, the main thread's long tasks (over 50 ms;
 * "blocking time" is their sum beyond 50 ms each) and how many points the chart draws, beside the
 * same figures for a claim page without a load test. Prints figures; never fails on time.
 *
 * Read-only, on the demo scenario of a running app (`npm start`): the verified hub-motor claim of
 * Tidewheel (its after-test has 4,801 samples) and another Tidewheel claim without a load test.
 *
 *   npx tsx tests/bench/loadtest-chart.ts [--rounds 5]     (APP_URL and DATABASE_URL as for the app)
 */
import pg from 'pg';
import { launch, newPage, signIn } from '../e2e/support/browser';

const args = process.argv.slice(2);
const i = args.indexOf('--rounds');
const ROUNDS = i >= 0 ? Number(args[i + 1]) : 5;
const DEALER = 'maya.lindqvist@tidewheel.test';
const DEMO_PART_SERIAL = 'HM750-25-2215';
const APP = process.env.APP_URL ?? 'http://127.0.0.1:3000';
process.env.APP_URL = APP;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1] ?? NaN;

async function demoClaims(): Promise<{ withRun: string; samples: number; without: string }> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL ?? 'postgres://loadproof@127.0.0.1:54329/loadproof' });
  await client.connect();
  try {
    const run = await client.query(
      `SELECT c.id, max(r.sample_count) AS samples FROM claims c JOIN load_test_runs r ON r.claim_id = c.id
       WHERE c.part_serial = $1 GROUP BY c.id`,
      [DEMO_PART_SERIAL],
    );
    const none = await client.query(
      `SELECT c.id FROM claims c JOIN organisations o ON o.id = c.dealer_id
       WHERE o.slug = 'tidewheel' AND NOT EXISTS (SELECT 1 FROM load_test_runs r WHERE r.claim_id = c.id) ORDER BY c.created_at LIMIT 1`,
    );
    if (!run.rows[0] || !none.rows[0]) throw new Error('the demo scenario is not loaded (start the app with npm start)');
    return { withRun: run.rows[0].id, samples: Number(run.rows[0].samples), without: none.rows[0].id };
  } finally {
    await client.end();
  }
}

async function main() {
  const claims = await demoClaims();
  const browser = await launch();
  const { page } = await newPage(browser);
  await signIn(page, DEALER);
  await page.addInitScript(() => {
    (window as unknown as { __long: number[] }).__long = [];
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) (window as unknown as { __long: number[] }).__long.push(e.duration);
    }).observe({ type: 'longtask', buffered: true });
  });
  type Row = { readyMs: number; longTasks: number; longestMs: number; tbtMs: number; points: number };
  const measure = async (id: string, ready: string): Promise<Row[]> => {
    const rows: Row[] = [];
    for (let round = 0; round < ROUNDS + 1; round++) {
      await page.goto(`/claims/${id}`);
      await page.locator(ready).first().waitFor();
      const m = await page.evaluate(() => {
        const long = (window as unknown as { __long: number[] }).__long;
        const nav = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming;
        const fig = document.querySelector('[data-testid=power-torque-chart]');
        return {
          readyMs: performance.now() - (nav?.startTime ?? 0),
          longTasks: long.length,
          longestMs: long.length ? Math.max(...long) : 0,
          tbtMs: long.reduce((sum, d) => sum + Math.max(0, d - 50), 0),
          points: Number(fig?.getAttribute('data-points') ?? 0),
        };
      });
      if (round > 0) rows.push(m); // the first load warms the server's caches
    }
    return rows;
  };
  const withChart = await measure(claims.withRun, '[data-testid=power-torque-chart] .recharts-line path');
  const baseline = await measure(claims.without, '[data-testid=claim-number]');
  await browser.close();

  const show = (rows: Row[]) =>
    rows.map((r) => ({ 'ready (ms)': r.readyMs.toFixed(0), 'long tasks': r.longTasks, 'longest task (ms)': r.longestMs.toFixed(0), 'blocking time (ms)': r.tbtMs.toFixed(0), 'points drawn': r.points }));
  console.log(`${APP}: claim page with dyno runs of up to ${claims.samples.toLocaleString('en')} samples, ${ROUNDS} loads after one warm-up (ready = chart drawn):`);
  console.table(show(withChart));
  console.log('A claim page without a load test (ready = page shown):');
  console.table(show(baseline));
  const med = (rows: Row[], k: keyof Row) => median(rows.map((r) => r[k])).toFixed(0);
  console.log(
    `median with chart: ready ${med(withChart, 'readyMs')} ms, longest task ${med(withChart, 'longestMs')} ms, blocking ${med(withChart, 'tbtMs')} ms; ` +
      `without: ready ${med(baseline, 'readyMs')} ms, longest task ${med(baseline, 'longestMs')} ms, blocking ${med(baseline, 'tbtMs')} ms; ` +
      `${withChart[0]?.points} points drawn (before and after curves) for ${claims.samples.toLocaleString('en')} samples in the larger run.`,
  );
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
