/**
 * Benchmark: the claim page of a typical dyno run (a few thousand samples) in headless Chromium.
 * Prints how long the overlay chart takes to appear after navigation, the main thread's long tasks
 * (over 50 ms; "total blocking time" is their sum beyond 50 ms each) and how many points the chart
 * draws. Prints figures; never fails on time. Needs the app running (APP_URL) on the database in
 * DATABASE_URL, with its storage:
 *
 *   npx tsx --conditions=react-server tests/bench/loadtest-chart.ts [--samples 5000] [--rounds 5]
 */
import { createHash, randomBytes } from 'node:crypto';
import { closeDb, db } from '@/db/connection';
import { findActiveUser } from '@/lib/db/users';
import { createDraft } from '@/lib/services/claims';
import type { APIRequestContext } from 'playwright-core';
import { launch, newPage, signIn } from '../e2e/support/browser';

const args = process.argv.slice(2);
const arg = (name: string, fallback: number) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 && args[i + 1] ? Number(args[i + 1]) : fallback;
};
const SAMPLES = arg('samples', 5000);
const ROUNDS = arg('rounds', 5);
const DEALER = 'lena.hartmann@kettenblatt.test';

/** A sweep to 25 km/h at 50 Hz in our column layout, power peaking near 20 km/h, torque consistent with 57-622. */
function dynoCsv(n: number): Buffer {
  const r = (Math.PI * (622 + 2 * 57)) / 1000 / (2 * Math.PI);
  const lines = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
  for (let i = 0; i < n; i++) {
    const kmh = 1 + (24 * i) / n + 0.05 * Math.sin(i * 1.7);
    const p = Math.max(3, 480 * Math.exp(-(((kmh - 20) / 9) ** 2)) + 4 * Math.sin(i * 0.9));
    lines.push(`${(i * 0.02).toFixed(2)},${kmh.toFixed(3)},${(p / (kmh / 3.6 / r)).toFixed(3)},${p.toFixed(2)}`);
  }
  return Buffer.from(lines.join('\n') + '\n');
}

async function emptyDraft(): Promise<string> {
  const uid = (await db()('users').where({ email: DEALER }).first('id')).id;
  const user = (await findActiveUser(uid))!;
  const brandId = (await db()('organisations').where({ slug: 'torvane' }).first('id')).id;
  const part = (await db()('parts').where({ brand_id: brandId, part_number: 'TV-DU85' }).first('id')).id;
  const draft = await createDraft(user, {
    brandId, frameSerial: 'KT25-004187', partId: part, partSerial: `BENCH-${randomBytes(3).toString('hex')}`, failureDate: '2026-11-20',
    symptom: 'Benchmark claim', errorCodes: '', description: '', customerName: '', customerEmail: '', customerPhone: '',
    parts: [{ partId: part, quantity: 1, fromDealerStock: false }], labor: [], freight: '',
  } as never);
  return draft.id;
}

/** A draft with one recorded before-test, uploaded through the app's own routes as a signed-in dealer. */
async function claimWithRun(api: APIRequestContext): Promise<string> {
  const draft = { id: await emptyDraft() };
  const bytes = dynoCsv(SAMPLES);
  const ticketRes = await api.post(`/api/claims/${draft.id}/uploads`, {
    data: { kind: 'load_test_before', fileName: 'bench.csv', size: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex'), contentType: 'text/csv' },
  });
  const ticket = await ticketRes.json();
  const put = await fetch(ticket.url, { method: 'PUT', headers: ticket.headers, body: new Uint8Array(bytes) });
  if (!put.ok) throw new Error(`storage PUT failed: ${put.status}`);
  const added = await api.post(`/api/claims/${draft.id}/load-tests`, { data: { intentId: ticket.intentId, units: 'metric', conditions: { tyreSize: '57-622' } } });
  if (added.status() !== 201) throw new Error(`the benchmark run was not recorded: ${await added.text()}`);
  return draft.id;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;

async function main() {
  const browser = await launch();
  const { page, context } = await newPage(browser);
  await signIn(page, DEALER);
  const claimId = await claimWithRun(context.request);
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
  const withChart = await measure(claimId, '[data-testid=power-torque-chart] .recharts-line path');
  // The same page with no load test yet: what the page costs without the chart.
  const baseline = await measure(await emptyDraft(), '[data-testid=load-test-upload-before]');
  const show = (rows: Row[]) =>
    rows.map((r) => ({ 'ready (ms)': r.readyMs.toFixed(0), 'long tasks': r.longTasks, 'longest task (ms)': r.longestMs.toFixed(0), 'blocking time (ms)': r.tbtMs.toFixed(0), 'points drawn': r.points }));
  console.log(`Claim page with a ${SAMPLES.toLocaleString('en')}-sample dyno run, ${ROUNDS} loads after one warm-up, headless Chromium (ready = chart drawn):`);
  console.table(show(withChart));
  console.log('The same page for a draft without a load test (ready = upload form shown):');
  console.table(show(baseline));
  const med = (rows: Row[], k: keyof Row) => median(rows.map((r) => r[k])).toFixed(0);
  console.log(
    `median with chart: ready ${med(withChart, 'readyMs')} ms, longest task ${med(withChart, 'longestMs')} ms, blocking ${med(withChart, 'tbtMs')} ms; ` +
      `without: ready ${med(baseline, 'readyMs')} ms, longest task ${med(baseline, 'longestMs')} ms, blocking ${med(baseline, 'tbtMs')} ms; ` +
      `${withChart[0]?.points} points drawn for ${SAMPLES} samples.`,
  );
  await browser.close();
  await closeDb();
}

main().catch(async (err) => {
  console.error(err);
  await closeDb();
  process.exit(1);
});
