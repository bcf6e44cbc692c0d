/**
 * Benchmark: what the server does with an uploaded dyno CSV (`analyseUpload`: parse, analysis in
 * both unit systems, the curve without run-downs, the verdict) against the library's own parse +
 * analysis (`analyseDynoCsv`), on a ten-minute 1 kHz log (600 000 samples, ~25 MB). Prints
 * figures; never fails on time.
 *
 *   npx tsx tests/bench/loadtest-upload.ts [--rounds 5] [--samples 600000]
 */
import { analyseDynoCsv } from '@/lib/loadtest';
import { analyseUpload } from '@/lib/loadtest-evidence';

const args = process.argv.slice(2);
const arg = (name: string, fallback: number) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 && args[i + 1] ? Number(args[i + 1]) : fallback;
};
const ROUNDS = arg('rounds', 5);
const SAMPLES = arg('samples', 600_000);
const C = (Math.PI * (622 + 2 * 57)) / 1000;

/** A sweep every minute: 0 → 32 km/h in 20 s under power, hold, then a 20 s run-down. Invented. */
function generate(n: number): Buffer {
  const r = C / (2 * Math.PI);
  const lines = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
  for (let i = 0; i < n; i++) {
    const t = i / 1000;
    const phase = t % 60;
    const kmh = phase < 20 ? 1.6 * phase : phase < 40 ? 32 : Math.max(0, 32 - 1.6 * (phase - 40));
    const torque = phase < 40 ? Math.max(0, 42 * (1 - kmh / 34)) + 0.3 * Math.sin(i) : 0.2;
    lines.push(`${t.toFixed(3)},${kmh.toFixed(6)},${torque.toFixed(6)},${(torque * (kmh / 3.6 / r)).toFixed(6)}`);
  }
  return Buffer.from(lines.join('\r\n') + '\r\n');
}

const bytes = generate(SAMPLES);
const conditions = {
  batterySocStartPct: 100, tyreSize: '57-622', measuredCircumferenceMm: null, tyrePressurePa: 400_000, tyreMaxPressurePa: 400_000,
  dynoId: null, rollerId: null, loadKg: null, ambientTempC: null, notes: '',
};
const spec = { kind: 'dyno', minWheelPowerW: 300, minWheelTorqueNm: 24, legalClass: 'eu-pedelec', partNumber: 'X' } as const;
const time = (f: () => void) => {
  const t0 = performance.now();
  f();
  return performance.now() - t0;
};
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1] as number;

const lib: number[] = [];
const upload: number[] = [];
let leftOut = 0;
for (let i = 0; i < ROUNDS; i++) {
  lib.push(time(() => {
    if (analyseDynoCsv(bytes, { circumferenceM: C, units: 'metric', legalClass: 'eu-pedelec' }).status !== 'ok') throw new Error('refused');
  }));
  upload.push(time(() => {
    const r = analyseUpload(bytes, { kind: 'dyno', spec, conditions });
    if (r.status !== 'ok' || r.summary.kind !== 'dyno') throw new Error('refused');
    leftOut = r.summary.curve.samplesLeftOut;
  }));
}
console.log(`${SAMPLES.toLocaleString('en')} samples, ${(bytes.length / 1e6).toFixed(1)} MB, ${ROUNDS} rounds, interleaved:`);
console.table({
  'library: analyseDynoCsv (parse + analysis, metric)': { 'median (ms)': median(lib).toFixed(0), 'min (ms)': Math.min(...lib).toFixed(0) },
  'upload: analyseUpload (parse + metric + imperial + curve)': { 'median (ms)': median(upload).toFixed(0), 'min (ms)': Math.min(...upload).toFixed(0) },
});
console.log(`upload ÷ library: ${(median(upload) / median(lib)).toFixed(2)}×; run-down samples left out of the curve: ${leftOut.toLocaleString('en')}`);
