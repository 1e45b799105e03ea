import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { freePort } from '../../db/server/mariadb.mjs';

/**
 * The built app as its own process (`next start`), on a free port of
 * 127.0.0.1, in its own process group so stopping it stops next-server too.
 * Opened as http://localhost:<port> (AUTH_URL), like a person would.
 */
export async function startAppProcess(env: Record<string, string>): Promise<{ url: string; stop: () => Promise<void> }> {
  const port = await freePort();
  const url = `http://localhost:${port}`;
  const child: ChildProcess = spawn(process.execPath, [path.join(process.cwd(), 'node_modules/next/dist/bin/next'), 'start', '-H', '127.0.0.1', '-p', String(port)], {
    cwd: process.cwd(),
    env: { ...process.env, NODE_ENV: 'production', NEXT_TELEMETRY_DISABLED: '1', AUTH_URL: url, ...env },
    detached: true,
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const stop = async () => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    try {
      process.kill(-child.pid!, 'SIGTERM');
    } catch {
      return;
    }
    const timer = setTimeout(() => {
      try {
        process.kill(-child.pid!, 'SIGKILL');
      } catch {}
    }, 10_000);
    await exited;
    clearTimeout(timer);
  };
  // Ready when /api/health answers (it also proves the database is reachable).
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`next start exited with ${child.exitCode}`);
    try {
      const res = await fetch(`http://127.0.0.1:${port}/api/health`);
      if (res.ok) break;
    } catch {}
    if (Date.now() > deadline) {
      await stop();
      throw new Error('next start did not become ready within 60 s');
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  return { url, stop };
}

/** Chromium flags for headless runs on this machine (see STACK.md). */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
