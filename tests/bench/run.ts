// Runs every benchmark in turn and prints their figures (`npm run bench`). Benchmarks never
// fail on time; a non-zero exit here means one could not run at all. PostgreSQL must be up
// (`npm start` in another terminal, or DATABASE_URL / BENCH_PG pointing at a server); the route
// benchmarks build the app first when no build exists.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = process.cwd();
const tsx = path.join(root, 'node_modules/.bin/tsx');
const only = process.argv.slice(2);

const benches: { file: string; serverOnly?: boolean; needsBuild?: boolean }[] = [
  { file: 'loadtest-dyno.ts' },
  { file: 'loadtest-upload.ts' },
  // Reads the demo scenario of the app `npm start` serves.
  { file: 'loadtest-chart.ts' },
  { file: 'reconcile-matching.ts' },
  { file: 'statement-import.ts' },
  { file: 'outbox-send.ts', serverOnly: true },
  { file: 'claims-list.ts', needsBuild: true },
  { file: 'review-queue.ts', serverOnly: true, needsBuild: true },
];

let failed = 0;
for (const b of benches) {
  if (only.length && !only.some((o) => b.file.includes(o))) continue;
  if (b.needsBuild && !fs.existsSync(path.join(root, '.next', 'BUILD_ID'))) {
    console.log('\n== building the app for the route benchmarks');
    if (spawnSync(path.join(root, 'node_modules/.bin/next'), ['build'], { stdio: 'inherit' }).status !== 0) process.exit(1);
  }
  console.log(`\n== ${b.file}`);
  const args = [...(b.serverOnly ? ['--conditions=react-server'] : []), path.join('tests/bench', b.file)];
  const r = spawnSync(tsx, args, { stdio: 'inherit', cwd: root });
  if (r.status !== 0) {
    failed++;
    console.log(`(${b.file} could not run: exit ${r.status ?? r.signal})`);
  }
}
process.exit(failed ? 1 : 0);
