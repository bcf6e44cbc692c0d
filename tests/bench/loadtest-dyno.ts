/**
 * Benchmark: a ten-minute 1 kHz dyno log (600 000 samples, ~25 MB) through papaparse alone and
 * through our parse + analysis. Prints figures; never fails on time.
 *
 *   npx tsx tests/bench/loadtest-dyno.ts [--rounds 7] [--samples 600000]
 *
 * Timing runs in this process, interleaved (papaparse, ours, papaparse, ours, …) so that load from
 * other work on the machine hits both alike; medians are reported. Baselines: `Papa.parse` with its
 * defaults and with the delimiter given (the "papaparse alone" of the target), and papaparse's
 * `Parser` class on whole-line chunks, which is how ours reads the file: the gap to that one is our
 * own conversion and analysis. Memory is measured in a fresh child process per variant, since a
 * process's peak RSS only ever grows; "ours from bytes" includes decoding the upload.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { getHeapStatistics, setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import Papa from 'papaparse';
import { analyseDynoCsv } from '@/lib/loadtest';

const args = process.argv.slice(2);
const arg = (name: string, fallback: string) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 && args[i + 1] ? (args[i + 1] as string) : fallback;
};

const CIRCUMFERENCE_M = (Math.PI * (622 + 2 * 57)) / 1000;
/** Whole-line chunks of about 256 KB through papaparse's Parser class: the parsing ours is built on. */
function papaparseParserChunks(text: string): void {
  const parser = new Papa.Parser({ delimiter: ',', newline: '\r\n' });
  for (let pos = 0; pos < text.length; ) {
    const nl = text.indexOf('\r\n', Math.min(text.length, pos + 256 * 1024));
    const end = nl === -1 ? text.length : nl;
    parser.parse(text.slice(pos, end), 0, false);
    pos = end + 2;
  }
}

const options = { circumferenceM: CIRCUMFERENCE_M, units: 'metric', legalClass: 'eu-pedelec' } as const;
const variants = {
  'papaparse (delimiter auto-detected, its default)': (text: string) => {
    Papa.parse<string[]>(text);
  },
  'papaparse (delimiter and line end given)': (text: string) => {
    Papa.parse<string[]>(text, { delimiter: ',', newline: '\r\n' });
  },
  'papaparse Parser class on line chunks': (text: string) => papaparseParserChunks(text),
  'ours: parse + analyse': (text: string) => {
    const r = analyseDynoCsv(text, options);
    if (r.status !== 'ok') throw new Error(`benchmark file refused: ${JSON.stringify(r).slice(0, 400)}`);
  },
} as const;
type Variant = keyof typeof variants;

/**
 * Invented run: a sweep every minute (0 → 32 km/h in 20 s under motor power, hold, coast down),
 * torque falling with speed, sensor noise, power from the dyno's own torque × speed.
 */
function generate(samples: number): string {
  const r = CIRCUMFERENCE_M / (2 * Math.PI);
  const lines: string[] = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
  let seed = 12345;
  const noise = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648 - 0.5;
  };
  for (let i = 0; i < samples; i++) {
    const t = i / 1000;
    const phase = t % 60;
    const kmh = phase < 20 ? 1.6 * phase : phase < 40 ? 32 : Math.max(0, 32 - 1.6 * (phase - 40));
    const torque = phase < 40 ? Math.max(0, 42 * (1 - kmh / 34)) + noise() : 0.2 * noise() + 0.2;
    const v = Math.max(0, kmh + 0.05 * noise());
    const power = Math.max(0, torque) * (v / 3.6 / r);
    // Six decimals, as a logger printing with C's %f writes them; Windows line endings.
    lines.push(`${t.toFixed(3)},${v.toFixed(6)},${Math.max(0, torque).toFixed(6)},${power.toFixed(6)}`);
  }
  return lines.join('\r\n') + '\r\n';
}

// A full collection before each timed run, so no variant pays for the garbage of the one before.
setFlagsFromString('--expose-gc');
const collectGarbage = runInNewContext('gc') as () => void;

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
};

function child(file: string, variant: Variant | 'read only' | 'ours from bytes'): void {
  if (variant === 'ours from bytes') {
    const r = analyseDynoCsv(new Uint8Array(readFileSync(file)), options);
    if (r.status !== 'ok') throw new Error('benchmark file refused');
  } else {
    const text = readFileSync(file, 'utf8');
    if (variant !== 'read only') variants[variant](text);
  }
  const heap = getHeapStatistics();
  process.stdout.write(
    JSON.stringify({ maxRssMb: process.resourceUsage().maxRSS / 1024, heapCommittedMb: heap.total_heap_size / 1048576, arrayBuffersMb: process.memoryUsage().arrayBuffers / 1048576 }),
  );
}

function main(): void {
  const samples = Number(arg('samples', '600000'));
  const rounds = Number(arg('rounds', '7'));
  const dir = mkdtempSync(path.join(tmpdir(), 'loadtest-bench-'));
  const file = path.join(dir, 'dyno.csv');
  try {
    const text = generate(samples);
    writeFileSync(file, text);
    const fileText = readFileSync(file, 'utf8');
    console.log(`file: ${samples} samples, ${(Buffer.byteLength(fileText) / 1e6).toFixed(1)} MB`);

    const times: Record<Variant, number[]> = Object.fromEntries(Object.keys(variants).map((k) => [k, []])) as unknown as Record<Variant, number[]>;
    for (const v of Object.keys(variants) as Variant[]) variants[v](fileText); // warm-up
    for (let r = 0; r < rounds; r++) {
      for (const v of Object.keys(variants) as Variant[]) {
        collectGarbage();
        const t0 = performance.now();
        variants[v](fileText);
        times[v].push(performance.now() - t0);
      }
    }
    console.log(`\ntime, median of ${rounds} interleaved rounds (ms):`);
    for (const v of Object.keys(variants) as Variant[]) {
      console.log(`  ${v.padEnd(50)} ${median(times[v]).toFixed(0).padStart(6)}   runs: ${times[v].map((x) => x.toFixed(0)).join(' ')}`);
    }
    const ours = median(times['ours: parse + analyse']);
    const given = median(times['papaparse (delimiter and line end given)']);
    const auto = median(times['papaparse (delimiter auto-detected, its default)']);
    console.log(`  ratio ours / papaparse (delimiter given):   ${(ours / given).toFixed(2)}   (target ≤ 1.5)`);
    console.log(`  ratio ours / papaparse (auto-detected):     ${(ours / auto).toFixed(2)}`);
    const parserOnly = median(times['papaparse Parser class on line chunks']);
    console.log(`  ratio ours / papaparse Parser on chunks:    ${(ours / parserOnly).toFixed(2)}   (our own conversion and analysis on top of the parsing)`);
    console.log(`  ours absolute:                              ${ours.toFixed(0)} ms   (target ≤ 1500 ms)`);

    console.log('\nmemory, one fresh process per variant (peak RSS is the OS high-water mark for the whole process):');
    for (const v of ['read only', ...Object.keys(variants), 'ours from bytes'] as Array<Variant | 'read only' | 'ours from bytes'>) {
      const res = spawnSync(process.execPath, ['--import', 'tsx', __filename, '--child', v, '--file', file], { encoding: 'utf8', cwd: process.cwd() });
      if (res.status !== 0) {
        console.log(`  ${v}: child failed: ${res.stderr.slice(0, 500)}`);
        continue;
      }
      const m = JSON.parse(res.stdout) as { maxRssMb: number; heapCommittedMb: number; arrayBuffersMb: number };
      console.log(
        `  ${v.padEnd(50)} peak RSS ${m.maxRssMb.toFixed(0).padStart(4)} MB   heap committed after run ${m.heapCommittedMb.toFixed(0).padStart(4)} MB   array buffers ${m.arrayBuffersMb.toFixed(0)} MB`,
      );
    }
    console.log('  (target: ours ≤ 300 MB peak RSS; "read only" is the process holding the file text and nothing else)');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const childVariant = arg('child', '');
if (childVariant) child(arg('file', ''), childVariant as Variant | 'read only' | 'ours from bytes');
else main();
