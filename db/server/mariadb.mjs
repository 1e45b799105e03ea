// Start and stop a private MariaDB server on loopback, with its data in a folder
// of the project. Plain Node (no packages): the bootstrap uses it before `npm ci`,
// and tests use it to run a second server they can stop.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';

const SBIN = ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin'];

/** Finds a MariaDB program by name in the usual places; returns null when absent. */
export function findProgram(name) {
  for (const dir of [...(process.env.PATH ?? '').split(':'), ...SBIN]) {
    if (!dir) continue;
    const p = path.join(dir, name);
    if (existsSync(p)) return p;
  }
  return null;
}

/** True when the MariaDB server, installer and client programs are all present. */
export function hasMariaDB() {
  return ['mariadbd', 'mariadb-install-db', 'mariadb-admin', 'mariadb'].every((n) => findProgram(n));
}

function isPortFree(port) {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once('error', () => resolve(false));
    srv.listen(port, '127.0.0.1', () => srv.close(() => resolve(true)));
  });
}

/** Finds a free TCP port on 127.0.0.1 (the OS picks it). */
export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

function ping(admin, socket) {
  const r = spawnSync(admin, ['--no-defaults', `--socket=${socket}`, '-uroot', '--connect-timeout=1', 'ping'], {
    stdio: 'ignore',
  });
  return r.status === 0;
}

const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

/**
 * Starts mariadbd with its data in `dataDir` (initialised on first use) and
 * waits until it answers. Returns a handle with `stop()`.
 * Throws when the port is taken or the server exits before answering.
 */
export async function startMariaDB({ dataDir, port, log = () => {} }) {
  const mariadbd = findProgram('mariadbd');
  const installDb = findProgram('mariadb-install-db');
  const admin = findProgram('mariadb-admin');
  if (!mariadbd || !installDb || !admin) throw new Error('MariaDB programs not found (install mariadb-server)');
  const data = path.join(dataDir, 'data');
  const run = path.join(dataDir, 'run');
  mkdirSync(run, { recursive: true });
  const socket = path.join(run, 'mariadb.sock');
  const pidFile = path.join(run, 'mariadb.pid');
  const errLog = path.join(run, 'mariadb.err');

  if (!existsSync(path.join(data, 'mysql'))) {
    mkdirSync(data, { recursive: true });
    log(`initialising a new MariaDB data directory in ${data}`);
    const r = spawnSync(
      installDb,
      [
        '--no-defaults',
        `--datadir=${data}`,
        '--user=root',
        '--auth-root-authentication-method=normal',
        '--skip-test-db',
        '--skip-name-resolve',
      ],
      { encoding: 'utf8' },
    );
    if (r.status !== 0) throw new Error(`mariadb-install-db failed: ${r.stderr || r.stdout}`);
  }

  if (ping(admin, socket)) throw new Error(`a MariaDB server already runs on ${socket}; stop it first`);
  if (!(await isPortFree(port))) throw new Error(`port ${port} on 127.0.0.1 is taken; set DB_PORT in .env`);

  const child = spawn(
    mariadbd,
    [
      '--no-defaults',
      `--datadir=${data}`,
      `--socket=${socket}`,
      `--pid-file=${pidFile}`,
      `--port=${port}`,
      '--bind-address=127.0.0.1',
      '--user=root',
      '--skip-name-resolve',
      `--log-error=${errLog}`,
      '--innodb-buffer-pool-size=128M',
      '--skip-log-bin',
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
      '--max-connections=300',
    ],
    // Own process group: a Ctrl-C in the terminal reaches us, and we shut the server down in order.
    { detached: true, stdio: 'ignore' },
  );
  let exited = false;
  let exitCode = null;
  const exitPromise = new Promise((resolve) => {
    child.once('exit', (code) => {
      exited = true;
      exitCode = code;
      resolve(code);
    });
  });

  const deadline = Date.now() + 60_000;
  while (!ping(admin, socket)) {
    if (exited) {
      let tail = '';
      try {
        tail = readFileSync(errLog, 'utf8').split('\n').slice(-15).join('\n');
      } catch {}
      throw new Error(`mariadbd exited with code ${exitCode} before answering:\n${tail}`);
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error('mariadbd did not answer within 60 s');
    }
    await sleep(100);
  }
  log(`MariaDB ${port} ready (pid ${child.pid})`);

  const sql = (statement) => {
    const r = spawnSync(findProgram('mariadb'), ['--no-defaults', `--socket=${socket}`, '-uroot', '-e', statement], {
      encoding: 'utf8',
    });
    if (r.status !== 0) throw new Error(`SQL failed: ${r.stderr}`);
    return r.stdout;
  };

  let stopping = null;
  const stop = () => {
    if (stopping) return stopping;
    stopping = (async () => {
      if (exited) return;
      // Orderly shutdown through SIGTERM; escalate only if it hangs.
      try {
        process.kill(child.pid, 'SIGTERM');
      } catch {}
      const t = setTimeout(() => {
        try {
          process.kill(child.pid, 'SIGKILL');
        } catch {}
      }, 30_000);
      await exitPromise;
      clearTimeout(t);
    })();
    return stopping;
  };

  return { pid: child.pid, port, socket, dataDir, sql, stop, exited: exitPromise };
}

/** Creates the database and an app user reachable over TCP from 127.0.0.1. */
export function ensureDatabase(server, { name, user, password, allDatabases = false }) {
  const esc = (s) => s.replace(/\\/g, '\\\\').replace(/'/g, "\\'");
  const scope = allDatabases ? '*.*' : `\`${name}\`.*`;
  server.sql(
    [
      `CREATE DATABASE IF NOT EXISTS \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
      `CREATE USER IF NOT EXISTS '${esc(user)}'@'127.0.0.1' IDENTIFIED BY '${esc(password)}'`,
      `CREATE USER IF NOT EXISTS '${esc(user)}'@'localhost' IDENTIFIED BY '${esc(password)}'`,
      `GRANT ALL PRIVILEGES ON ${scope} TO '${esc(user)}'@'127.0.0.1'`,
      `GRANT ALL PRIVILEGES ON ${scope} TO '${esc(user)}'@'localhost'`,
      'FLUSH PRIVILEGES',
    ].join(';'),
  );
}
