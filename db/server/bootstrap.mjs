// `npm start` and `npm test`: bring a fresh Debian machine with Node 20 from a
// clean clone to a running app (or a finished test run) with nothing done by hand.
//
//   start: install what is missing, start the private MariaDB (data in .data/,
//          kept between runs), migrate, load the demo once, build, start the
//          capture SMTP server and the outbox worker, serve on
//          http://localhost:PORT (bound to 127.0.0.1). Ctrl-C stops it all.
//   test:  the same on a throwaway data directory, then type-check, lint and
//          every test; the data directory is removed at the end.
//
// Plain Node with no packages: it runs before `npm ci`.
import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureDatabase, freePort, hasMariaDB, startMariaDB } from './mariadb.mjs';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const mode = process.argv[2];
const extraArgs = process.argv.slice(3);
if (mode !== 'start' && mode !== 'test') {
  console.error('usage: node db/server/bootstrap.mjs start|test');
  process.exit(2);
}

const log = (msg) => console.log(`[trialbed] ${msg}`);
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

function readDotEnv(file) {
  const out = {};
  if (!existsSync(file)) return out;
  for (const line of readFileSync(file, 'utf8').split(/\r?\n/)) {
    const m = line.match(/^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(.*)\s*$/);
    if (!m) continue;
    let v = m[2];
    if (/^(["']).*\1$/.test(v)) v = v.slice(1, -1);
    // An unquoted value ends at a ` #` comment, as in .env.example.
    else v = v.replace(/\s+#.*$/, '').trim();
    out[m[1]] = v;
  }
  return out;
}

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: ROOT, ...opts });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} exited with ${r.status ?? r.signal}`);
}

let aptUpdated = false;
function aptInstall(pkgs) {
  // As root on CI and the dev machines; through sudo elsewhere.
  const apt = (...args) => (isRoot ? run('apt-get', args, { env: aptEnv }) : run('sudo', ['apt-get', ...args], { env: aptEnv }));
  const aptEnv = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    log('apt-get update');
    apt('update', '-qq');
    aptUpdated = true;
  }
  log(`apt-get install ${pkgs.join(' ')}`);
  apt('install', '-y', '-qq', ...pkgs);
}

function ensureSystemPackages() {
  const need = [];
  if (!hasMariaDB()) need.push('mariadb-server', 'mariadb-client');
  if (mode === 'test' && !existsSync('/usr/bin/chromium')) need.push('chromium');
  if (need.length) aptInstall(need);
}

function ensureNodeModules() {
  const lock = path.join(ROOT, 'package-lock.json');
  const stamp = path.join(ROOT, 'node_modules', '.package-lock.json');
  const stale = !existsSync(stamp) || statSync(stamp).mtimeMs < statSync(lock).mtimeMs;
  if (stale) {
    log('npm ci');
    run('npm', ['ci', '--no-audit', '--no-fund']);
  }
}

// ---------------------------------------------------------------- environment
const fileEnv = readDotEnv(path.join(ROOT, '.env'));
const env = { ...fileEnv, ...process.env };
const dataRoot =
  mode === 'test'
    ? path.join(ROOT, '.test-data', `run-${process.pid}-${Date.now()}`)
    : path.resolve(ROOT, env.DATA_DIR ?? '.data');
mkdirSync(dataRoot, { recursive: true });

function persistentSecret(name) {
  const f = path.join(dataRoot, name);
  if (existsSync(f)) return readFileSync(f, 'utf8').trim();
  const s = randomBytes(32).toString('base64url');
  writeFileSync(f, s, { mode: 0o600 });
  return s;
}

const children = new Set();
let db = null;
let shuttingDown = false;

async function shutdown(code) {
  if (shuttingDown) return;
  shuttingDown = true;
  for (const child of children) {
    try {
      process.kill(-child.pid, 'SIGTERM');
    } catch {}
  }
  await Promise.all(
    [...children].map(
      (c) =>
        new Promise((resolve) => {
          if (c.exitCode !== null || c.signalCode !== null) return resolve();
          const t = setTimeout(() => {
            try {
              process.kill(-c.pid, 'SIGKILL');
            } catch {}
          }, 10_000);
          c.once('exit', () => {
            clearTimeout(t);
            resolve();
          });
        }),
    ),
  );
  if (db) {
    log('stopping MariaDB');
    await db.stop();
  }
  if (mode === 'test' && !env.KEEP_TEST_DATA) rmSync(dataRoot, { recursive: true, force: true });
  process.exit(code);
}

for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
  process.on(sig, () => {
    log(`${sig}: stopping`);
    shutdown(mode === 'start' ? 0 : 130);
  });
}

/** Runs a command in its own process group so shutdown can stop it and its children. */
function spawnTracked(cmd, args, childEnv, { name } = {}) {
  const child = spawn(cmd, args, { cwd: ROOT, env: childEnv, stdio: 'inherit', detached: true });
  children.add(child);
  child.once('exit', () => children.delete(child));
  return new Promise((resolve) => {
    child.once('exit', (code, signal) => resolve({ code: code ?? (signal ? 1 : 0), signal, name }));
  });
}

const tsx = (script, ...args) => ['node', ['--conditions=react-server', '--import', 'tsx', script, ...args]];

/**
 * `npm start` only: the capture SMTP server (lib/mail/capture-server.ts) on
 * 127.0.0.1:SMTP_PORT, storing mail under DATA_DIR/mailbox for /dev/mailbox.
 * Skipped when SMTP_HOST points at a real provider. Tests start their own.
 */
function startCaptureSmtp(childEnv) {
  const host = childEnv.SMTP_HOST ?? '127.0.0.1';
  if (!['127.0.0.1', 'localhost', '::1'].includes(host)) {
    log(`mail goes to ${host}:${childEnv.SMTP_PORT ?? 2525}; no capture server`);
    return;
  }
  const port = childEnv.SMTP_PORT ?? '2525';
  log(`capture SMTP server on 127.0.0.1:${port} (mail shows at /dev/mailbox)`);
  const [cmd, args] = tsx('lib/mail/capture-server.ts');
  spawnTracked(cmd, args, { ...childEnv, SMTP_PORT: port }, { name: 'capture SMTP server' }).then((r) => {
    if (!shuttingDown && r.code !== 0) log(`the capture SMTP server stopped (exit ${r.code}); sign-in mail will fail until it runs`);
  });
}

/**
 * `npm start` only: the outbox worker (lib/mail/outbox-worker.ts), which
 * sends the mail services write to the outbox — update mail, check-in
 * reminders, the weekly digest — through SMTP_* (the capture server locally).
 * MAIL_WORKER=0 leaves it out (run `npm run mail:worker` elsewhere). If it
 * stops unexpectedly it is started again after a pause; mail waits in the
 * outbox meanwhile, so nothing is lost.
 */
function startOutboxWorker(childEnv) {
  if (childEnv.MAIL_WORKER === '0') {
    log('MAIL_WORKER=0: no outbox worker here (mail waits in the outbox)');
    return;
  }
  const [cmd, args] = tsx('lib/mail/outbox-worker.ts');
  const launch = () => {
    log('outbox worker: sends update mail, reminders and weekly digests');
    spawnTracked(cmd, args, childEnv, { name: 'outbox worker' }).then((r) => {
      if (shuttingDown) return;
      log(`the outbox worker stopped (exit ${r.code}); starting it again in 5 s`);
      setTimeout(() => !shuttingDown && launch(), 5_000).unref();
    });
  };
  launch();
}

async function main() {
  ensureSystemPackages();
  ensureNodeModules();

  const dbPort = mode === 'test' ? await freePort() : Number(env.DB_PORT ?? 3317);
  const dbName = env.DB_NAME ?? (mode === 'test' ? 'trialbed_test' : 'trialbed');
  const dbUser = env.DB_USER ?? 'trialbed';
  const dbPassword = env.DB_PASSWORD ?? persistentSecret('db-password');
  const appPort = Number(env.PORT ?? 3000);

  db = await startMariaDB({ dataDir: path.join(dataRoot, 'mariadb'), port: dbPort, log });
  // Tests create scratch databases of their own, so the test user gets every database.
  ensureDatabase(db, { name: dbName, user: dbUser, password: dbPassword, allDatabases: mode === 'test' });

  const childEnv = {
    ...env,
    NEXT_TELEMETRY_DISABLED: '1',
    DB_HOST: '127.0.0.1',
    DB_PORT: String(dbPort),
    DB_NAME: dbName,
    DB_USER: dbUser,
    DB_PASSWORD: dbPassword,
    DB_SOCKET: db.socket,
    DATA_DIR: dataRoot,
    AUTH_SECRET: env.AUTH_SECRET ?? persistentSecret('auth-secret'),
    AUTH_URL: env.AUTH_URL ?? `http://localhost:${appPort}`,
    AUTH_TRUST_HOST: env.AUTH_TRUST_HOST ?? 'true',
    TRIALBED_DEMO: env.TRIALBED_DEMO ?? '1',
    PORT: String(appPort),
  };

  const step = async (label, [cmd, args], stepEnv = childEnv) => {
    log(label);
    const r = await spawnTracked(cmd, args, stepEnv, { name: label });
    if (shuttingDown) return r;
    if (r.code !== 0) throw new Error(`${label} failed (exit ${r.code})`);
    return r;
  };

  await step('migrating the database', tsx('db/cli.ts', 'migrate'));
  await step('loading the demo scenario (once)', tsx('db/cli.ts', 'seed-demo'));

  if (mode === 'start') {
    if (env.SKIP_BUILD !== '1') await step('building the app (next build)', ['npx', ['next', 'build']], { ...childEnv, NODE_ENV: 'production' });
    startCaptureSmtp(childEnv);
    startOutboxWorker(childEnv);
    log(`serving on http://localhost:${appPort} (bound to 127.0.0.1); Ctrl-C stops everything`);
    const r = await spawnTracked('npx', ['next', 'start', '-H', '127.0.0.1', '-p', String(appPort)], { ...childEnv, NODE_ENV: 'production' });
    if (!shuttingDown) {
      log(`the app exited (${r.code}); stopping`);
      await shutdown(r.code || 1);
    }
    return;
  }

  // ---- test mode
  const results = [];
  const record = async (label, cmd) => {
    if (shuttingDown) return;
    log(label);
    const r = await spawnTracked(cmd[0], cmd[1], { ...childEnv, NODE_ENV: 'production' });
    results.push({ label, ok: r.code === 0 });
    return r;
  };
  await record('type-check (tsc --noEmit)', ['npx', ['tsc', '--noEmit', '-p', '.']]);
  await record('lint (eslint)', ['npx', ['eslint', '.', '--max-warnings=0']]);
  await record('building the app for the HTTP and browser tests (next build)', ['npx', ['next', 'build']]);
  const reportFile = path.join(dataRoot, 'vitest-report.json');
  const vitestEnv = { ...childEnv, NODE_ENV: 'test' };
  log('running the tests (vitest)');
  const vr = await spawnTracked(
    'npx',
    ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${reportFile}`, ...extraArgs],
    vitestEnv,
  );
  results.push({ label: 'vitest', ok: vr.code === 0 });
  let passed = 0;
  let failed = 0;
  let skipped = 0;
  try {
    const rep = JSON.parse(readFileSync(reportFile, 'utf8'));
    passed = rep.numPassedTests ?? 0;
    failed = rep.numFailedTests ?? 0;
    skipped = (rep.numPendingTests ?? 0) + (rep.numTodoTests ?? 0);
  } catch {
    failed += 1;
  }
  // A file that fails to load counts no test as failed; still a failure.
  if (vr.code !== 0 && failed === 0) failed = 1;
  const broken = results.filter((r) => !r.ok);
  for (const r of results) log(`${r.ok ? 'ok  ' : 'FAIL'} ${r.label}`);
  // Checks outside vitest count as one test each in the summary line.
  const checkFailures = broken.filter((r) => r.label !== 'vitest').length;
  const checkPasses = results.filter((r) => r.ok && r.label !== 'vitest').length;
  console.log(`Tests: ${passed + checkPasses} passed, ${failed + checkFailures} failed, ${skipped} skipped`);
  await shutdown(broken.length ? 1 : 0);
}

main().catch(async (err) => {
  console.error(`[trialbed] ${err.message}`);
  await shutdown(1);
});
