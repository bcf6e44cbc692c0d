#!/usr/bin/env node
// Brings the whole local stack up from nothing: npm packages, PostgreSQL (installed from
// Debian when absent, run in .data/ on loopback), migrations and demo data, the local fakes
// for S3, SMTP and the carrier, the outbox worker and the app. Plain Node with no
// dependencies, because it runs before `npm install` has.
//
//   node scripts/stack.mjs start   build and serve the app with the demo scenario
//   node scripts/stack.mjs dev     the same with `next dev`
//   node scripts/stack.mjs test    a separate test database, then unit, integration and browser tests
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const mode = process.argv[2] ?? 'start';
if (!['start', 'dev', 'test'].includes(mode)) {
  console.error(`usage: node scripts/stack.mjs start|dev|test`);
  process.exit(2);
}
const testing = mode === 'test';

// Each mode has its own ports and data folder so tests can run beside a running demo.
// LOADPROOF_PORT_OFFSET shifts them all, so several checkouts can run their stacks side by side.
const portOffset = Number.parseInt(process.env.LOADPROOF_PORT_OFFSET ?? '0', 10) || 0;
const basePorts = testing
  ? { pg: 54339, app: 3100, s3: 4579, smtp: 2535, mailbox: 2590, carrier: 4610 }
  : { pg: 54329, app: 3000, s3: 4569, smtp: 2525, mailbox: 2580, carrier: 4600 };
const ports = Object.fromEntries(Object.entries(basePorts).map(([k, v]) => [k, v + portOffset]));
const dataDir = path.join(root, '.data', testing ? 'test' : 'local');
const dbName = testing ? 'loadproof_test' : 'loadproof';
const appUrl = `http://127.0.0.1:${ports.app}`;

const children = [];
let stopping = false;

function log(msg) {
  console.log(`\x1b[32m[loadproof]\x1b[0m ${msg}`);
}

function fail(msg) {
  console.error(`\x1b[31m[loadproof]\x1b[0m ${msg}`);
  shutdown(1);
}

// Once Ctrl-C has been pressed, no later phase may start anything new.
const halted = () => new Promise(() => {});

function run(cmd, args, opts = {}) {
  if (stopping) return;
  const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
  if (r.status !== 0 && !stopping) fail(`${cmd} ${args.join(' ')} exited with ${r.status ?? r.signal}`);
}

function quiet(cmd, args, opts = {}) {
  return spawnSync(cmd, args, { cwd: root, encoding: 'utf8', ...opts });
}

function hashOf(files) {
  const h = createHash('sha256');
  for (const f of files) {
    const p = path.join(root, f);
    if (fs.existsSync(p)) h.update(fs.readFileSync(p));
  }
  return h.digest('hex');
}

// ---------------------------------------------------------------- npm packages
function ensurePackages() {
  const stamp = path.join(root, 'node_modules', '.loadproof-install');
  const want = hashOf(['package.json', 'package-lock.json']);
  if (fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8') === want) return;
  log('installing npm packages…');
  const hasLock = fs.existsSync(path.join(root, 'package-lock.json'));
  run('npm', [hasLock ? 'ci' : 'install', '--no-audit', '--no-fund']);
  fs.writeFileSync(stamp, want);
}

// ---------------------------------------------------------------- Debian packages
function asRoot(cmd, args) {
  if (process.getuid?.() === 0) run(cmd, args, { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  else run('sudo', ['-E', cmd, ...args], { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
}

let aptUpdated = false;
function aptInstall(pkgs) {
  if (!aptUpdated) {
    asRoot('apt-get', ['update']);
    aptUpdated = true;
  }
  asRoot('apt-get', ['install', '-y', '--no-install-recommends', ...pkgs]);
}

function findPgBin() {
  if (process.env.PG_BIN && fs.existsSync(path.join(process.env.PG_BIN, 'initdb'))) return process.env.PG_BIN;
  const base = '/usr/lib/postgresql';
  if (!fs.existsSync(base)) return null;
  const versions = fs.readdirSync(base).filter((v) => fs.existsSync(path.join(base, v, 'bin', 'initdb')));
  versions.sort((a, b) => Number(b) - Number(a));
  return versions[0] ? path.join(base, versions[0], 'bin') : null;
}

function ensurePostgresInstalled() {
  let bin = findPgBin();
  if (!bin) {
    log('PostgreSQL server not found; installing Debian package postgresql…');
    aptInstall(['postgresql']);
    bin = findPgBin();
    if (!bin) fail('postgresql installed but initdb was not found under /usr/lib/postgresql');
  }
  return bin;
}

function ensureChromium() {
  if (fs.existsSync('/usr/bin/chromium')) return;
  log('Chromium not found; installing Debian package chromium…');
  aptInstall(['chromium']);
}

// ---------------------------------------------------------------- PostgreSQL
// initdb and postgres refuse to run as root, so as root the cluster belongs to an
// unprivileged system user.
function clusterOwner() {
  if (process.getuid?.() !== 0) return null;
  const name = 'postgres';
  let r = quiet('id', ['-u', name]);
  if (r.status !== 0) {
    run('useradd', ['--system', '--no-create-home', '--shell', '/usr/sbin/nologin', name]);
    r = quiet('id', ['-u', name]);
  }
  const uid = Number(r.stdout.trim());
  const gid = Number(quiet('id', ['-g', name]).stdout.trim());
  return { name, uid, gid };
}

function portOpen(port) {
  return new Promise((resolve) => {
    const s = net.connect({ host: '127.0.0.1', port }, () => {
      s.destroy();
      resolve(true);
    });
    s.on('error', () => resolve(false));
  });
}

async function waitFor(check, what, ms = 60_000) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  fail(`timed out waiting for ${what}`);
}

async function startPostgres(bin) {
  const pgData = path.join(dataDir, 'pg');
  const owner = clusterOwner();
  const idOpts = owner ? { uid: owner.uid, gid: owner.gid } : {};
  fs.mkdirSync(dataDir, { recursive: true });
  if (owner) {
    // The service user must be able to reach the data folder through the checkout.
    for (let d = dataDir; d !== path.dirname(d); d = path.dirname(d)) {
      const mode = fs.statSync(d).mode;
      if ((mode & 0o001) === 0) fs.chmodSync(d, mode | 0o001);
      if (d === '/') break;
    }
  }
  if (!fs.existsSync(path.join(pgData, 'PG_VERSION'))) {
    log(`initialising PostgreSQL cluster in ${path.relative(root, pgData)}`);
    fs.mkdirSync(pgData, { recursive: true, mode: 0o700 });
    if (owner) fs.chownSync(pgData, owner.uid, owner.gid);
    const r = spawnSync(
      path.join(bin, 'initdb'),
      ['-D', pgData, '-U', 'loadproof', '--auth=trust', '--encoding=UTF8', '--locale=C.UTF-8'],
      { stdio: ['ignore', 'ignore', 'inherit'], ...idOpts },
    );
    if (r.status !== 0) fail('initdb failed');
  }
  const sockDir = path.join(dataDir, 'sock');
  fs.mkdirSync(sockDir, { recursive: true });
  if (owner) fs.chownSync(sockDir, owner.uid, owner.gid);

  if (await portOpen(ports.pg)) {
    log(`PostgreSQL already answering on 127.0.0.1:${ports.pg}; using it`);
  } else {
    const logFile = fs.openSync(path.join(dataDir, 'postgres.log'), 'a');
    if (owner) fs.fchownSync(logFile, owner.uid, owner.gid);
    const pg = spawn(
      path.join(bin, 'postgres'),
      [
        '-D', pgData,
        '-p', String(ports.pg),
        '-c', 'listen_addresses=127.0.0.1',
        '-c', `unix_socket_directories=${sockDir}`,
        '-c', 'max_connections=200',
        '-c', 'shared_buffers=256MB',
        '-c', 'fsync=' + (testing ? 'off' : 'on'),
        '-c', 'synchronous_commit=' + (testing ? 'off' : 'on'),
      ],
      { stdio: ['ignore', logFile, logFile], ...idOpts },
    );
    children.push({ name: 'postgres', proc: pg, signal: 'SIGINT' });
    pg.on('exit', (code) => {
      if (!stopping) fail(`PostgreSQL stopped (code ${code}); see ${path.relative(root, dataDir)}/postgres.log`);
    });
    await waitFor(
      async () => quiet(path.join(bin, 'pg_isready'), ['-h', '127.0.0.1', '-p', String(ports.pg)]).status === 0,
      'PostgreSQL',
    );
    log(`PostgreSQL on 127.0.0.1:${ports.pg}`);
  }

  const psql = (sql, db = 'postgres') =>
    quiet(path.join(bin, 'psql'), ['-h', '127.0.0.1', '-p', String(ports.pg), '-U', 'loadproof', '-d', db, '-Atqc', sql]);
  if (testing) {
    psql(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
  }
  const exists = psql(`SELECT 1 FROM pg_database WHERE datname = '${dbName}'`).stdout.trim() === '1';
  if (!exists) {
    const r = psql(`CREATE DATABASE ${dbName}`);
    if (r.status !== 0) fail(`could not create database ${dbName}: ${r.stderr}`);
    log(`created database ${dbName}`);
  }
}

// ---------------------------------------------------------------- children
function childEnv() {
  const e = { ...process.env };
  const defaults = {
    DATABASE_URL: `postgres://loadproof@127.0.0.1:${ports.pg}/${dbName}`,
    APP_URL: appUrl,
    NEXTAUTH_URL: appUrl,
    S3_ENDPOINT: `http://127.0.0.1:${ports.s3}`,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(ports.smtp),
    LOCAL_MAILBOX_URL: `http://127.0.0.1:${ports.mailbox}`,
    CARRIER_URL: `http://127.0.0.1:${ports.carrier}`,
    LOCAL_S3_PORT: String(ports.s3),
    LOCAL_SMTP_PORT: String(ports.smtp),
    LOCAL_MAILBOX_PORT: String(ports.mailbox),
    LOCAL_CARRIER_PORT: String(ports.carrier),
    LOCAL_DATA_DIR: dataDir,
    NEXT_DIST_DIR: testing ? '.next-test' : '.next',
    NEXT_TELEMETRY_DISABLED: '1',
    // The installed AWS SDK supports this machine's Node 20; its notice is about releases after January 2027.
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
  };
  // Real services win: a variable already set is left alone.
  for (const [k, v] of Object.entries(defaults)) if (!e[k]) e[k] = v;
  if (testing) e.LOADPROOF_TEST = '1';
  return e;
}

const bin = (name) => path.join(root, 'node_modules', '.bin', name);

function startChild(name, cmd, args, { ready, env } = {}) {
  if (stopping) return halted();
  const proc = spawn(cmd, args, { cwd: root, env: env ?? childEnv(), stdio: ['ignore', 'pipe', 'pipe'], detached: true });
  children.push({ name, proc, signal: 'SIGTERM', group: true });
  let resolveReady;
  const readyP = new Promise((r) => (resolveReady = r));
  const onData = (stream) => (chunk) => {
    const text = chunk.toString();
    for (const line of text.split('\n')) if (line.trim()) stream.write(`  ${name} | ${line}\n`);
    if (ready && text.includes(ready)) resolveReady();
  };
  proc.stdout.on('data', onData(process.stdout));
  proc.stderr.on('data', onData(process.stderr));
  proc.on('exit', (code, sig) => {
    if (!stopping) fail(`${name} stopped (${code ?? sig})`);
  });
  if (!ready) resolveReady();
  return readyP;
}

function shutdown(code = 0) {
  if (stopping) return;
  stopping = true;
  for (const c of [...children].reverse()) {
    if (c.proc.exitCode !== null || c.proc.signalCode !== null) continue;
    try {
      if (c.group) process.kill(-c.proc.pid, c.signal);
      else c.proc.kill(c.signal);
    } catch {
      /* already gone */
    }
  }
  const pg = children.find((c) => c.name === 'postgres');
  const finish = () => process.exit(code);
  if (pg && pg.proc.exitCode === null) {
    pg.proc.once('exit', finish);
    setTimeout(finish, 10_000).unref();
  } else {
    setTimeout(finish, 300).unref();
  }
}

process.on('SIGINT', () => {
  log('stopping…');
  shutdown(0);
});
process.on('SIGTERM', () => shutdown(0));

// ---------------------------------------------------------------- build
function sourceHash() {
  const h = createHash('sha256');
  const walk = (dir) => {
    for (const ent of fs.readdirSync(path.join(root, dir), { withFileTypes: true })) {
      const rel = path.join(dir, ent.name);
      if (ent.isDirectory()) walk(rel);
      else {
        h.update(rel);
        h.update(fs.readFileSync(path.join(root, rel)));
      }
    }
  };
  for (const d of ['app', 'components', 'lib', 'machines', 'public']) if (fs.existsSync(path.join(root, d))) walk(d);
  h.update(hashOf(['package-lock.json', 'next.config.ts', 'tailwind.config.ts', 'postcss.config.mjs', 'tsconfig.json']));
  return h.digest('hex');
}

function build(distDir) {
  const stamp = path.join(root, distDir, '.loadproof-source');
  const want = sourceHash();
  if (fs.existsSync(path.join(root, distDir, 'BUILD_ID')) && fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8') === want) {
    log('build is up to date');
    return;
  }
  log('building the app…');
  run(bin('next'), ['build'], { env: childEnv() });
  if (!stopping) fs.writeFileSync(stamp, want);
}

// ---------------------------------------------------------------- main
function printSignIns() {
  console.log('');
  log(`Loadproof is running at ${appUrl}`);
  spawnSync(bin('tsx'), ['scripts/sign-ins.ts'], { cwd: root, stdio: 'inherit' });
  console.log(`\n  Caught e-mail: sign in as an admin and open "Mailbox", or ${childEnv().LOCAL_MAILBOX_URL}/messages`);
  console.log('  Press Ctrl-C to stop everything.\n');
}

async function main() {
  ensurePackages();
  const pgBin = ensurePostgresInstalled();
  if (testing) ensureChromium();
  await startPostgres(pgBin);

  if (testing) {
    // The test database starts empty every run; so do the fakes' stores, or old parcels and
    // objects would collide with the new run's numbers.
    for (const d of ['s3', 'carrier']) fs.rmSync(path.join(dataDir, d), { recursive: true, force: true });
  }
  // The fakes first: the demo scenario puts its load-test files and photos into storage.
  await startChild('fakes', bin('tsx'), ['scripts/local-services.ts'], { ready: 'local services ready' });

  log('migrating and loading the demo scenario…');
  run(bin('tsx'), ['--conditions=react-server', 'scripts/migrate.ts'], { env: childEnv() });

  if (testing) {
    const env = childEnv();
    const vitest = (project) => spawnSync(bin('vitest'), ['run', '--project', project], { cwd: root, env, stdio: 'inherit' });
    // `npm test -- e2e` (or unit, integration) runs only those projects; plain `npm test` runs all.
    const chosen = process.argv.slice(3);
    const runs = (project) => !chosen.length || chosen.includes(project);
    let failed = [];
    for (const project of ['unit', 'integration'].filter(runs)) {
      log(`running ${project} tests…`);
      if (vitest(project).status !== 0) failed.push(project);
    }
    if (!runs('e2e')) {
      if (failed.length) console.error(`\n\x1b[31m[loadproof]\x1b[0m failed: ${failed.join(', ')}`);
      else log('all chosen tests passed');
      shutdown(failed.length ? 1 : 0);
      return;
    }
    build('.next-test');
    await startChild('worker', bin('tsx'), ['--conditions=react-server', 'scripts/worker.ts'], { ready: 'worker ready' });
    await startChild('app', bin('next'), ['start', '-H', '127.0.0.1', '-p', String(ports.app)], { ready: 'Ready' });
    await waitFor(() => portOpen(ports.app), 'the app');
    log('running browser tests…');
    if (vitest('e2e').status !== 0) failed.push('e2e');
    if (failed.length) console.error(`\n\x1b[31m[loadproof]\x1b[0m failed: ${failed.join(', ')}`);
    else log('all tests passed');
    shutdown(failed.length ? 1 : 0);
    return;
  }

  await startChild('worker', bin('tsx'), ['--conditions=react-server', 'scripts/worker.ts'], { ready: 'worker ready' });
  if (mode === 'dev') {
    await startChild('app', bin('next'), ['dev', '-H', '127.0.0.1', '-p', String(ports.app)], { ready: 'Ready' });
  } else {
    build('.next');
    await startChild('app', bin('next'), ['start', '-H', '127.0.0.1', '-p', String(ports.app)], { ready: 'Ready' });
  }
  printSignIns();
}

main().catch((err) => fail(err?.stack ?? String(err)));
