/**
 * Outbox worker throughput: N update mails queued for N readers, sent by one
 * worker (pooled SMTP, four mails in flight, as in production) to the capture
 * server in its own process on a free port, which parses and stores every message. Needs a database (the DB_* settings of
 * `npm start` or a test run); skipped without one.
 * Target: at least MIN_PER_SECOND mails a second on the 2-core machine. The
 * capture server, which parses and stores every message in one process, is
 * the slower side here (16–24 mails/s measured here); a provider's SMTP
 * accepts more, and `concurrency` keeps several connections busy.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import nodemailer from 'nodemailer';
import { freePort } from '../../db/server/mariadb.mjs';

const N = 200;
const MIN_PER_SECOND = 10;

async function main() {
  if (!process.env.DB_PASSWORD && !process.env.DB_PORT) {
    console.log('outbox worker: skipped (set DB_HOST/DB_PORT/DB_USER/DB_PASSWORD of a running database)');
    return 0;
  }
  const { sequelize } = await import('@/db');
  const { Feedstock, OutboxMessage, Subscription } = await import('@/db/models');
  const { drainOutbox } = await import('@/lib/mail/outbox-worker');
  // The capture server in its own process, as `npm start` runs it: it parses and stores every message.
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-bench-mail-'));
  const port = await freePort();
  const capture = spawn(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'lib/mail/capture-server.ts'], {
    env: { ...process.env, SMTP_PORT: String(port), DATA_DIR: dataDir },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve, reject) => {
    capture.stdout!.on('data', (b: Buffer) => b.toString().includes('capture SMTP server on') && resolve());
    capture.once('exit', (code) => reject(new Error(`capture server exited with ${code}`)));
  });
  const transport = nodemailer.createTransport({ host: '127.0.0.1', port, pool: true, maxConnections: 4 });
  const f = await Feedstock.create({ slug: `bench-mail-${Date.now()}`, name: 'Bench peel', category: 'fruit', family: null, cnRatio: null, nitrogenPct: null, moisturePct: null, bulkDensityKgM3: null, referenceSource: null, summary: '', pageText: '', handlingCautions: [] });
  try {
    await drainOutbox({ transport, log: () => {} }); // whatever was due before
    const subs = await Subscription.bulkCreate(Array.from({ length: N }, (_, i) => ({ feedstockId: f.id, email: `bench-${i}-${f.id}@example.test`, mode: 'immediate' as const, confirmedAt: new Date() })));
    await OutboxMessage.bulkCreate(
      subs.map((s) => ({
        kind: 'proposal-opened',
        recipient: s.email,
        subscriptionId: s.id,
        feedstockId: f.id,
        dedupeKey: `bench:${f.id}:${s.id}`,
        payload: { proposalId: 1, summary: 'Small amounts only in open beds', trialCount: 3 },
      })),
    );
    const t0 = performance.now();
    const r = await drainOutbox({ transport, log: () => {}, batchSize: 50 });
    const seconds = (performance.now() - t0) / 1000;
    const perSecond = r.sent / seconds;
    console.log(`outbox worker: ${r.sent} mails in ${seconds.toFixed(2)} s = ${perSecond.toFixed(1)} mails/s (target ≥ ${MIN_PER_SECOND}) ${perSecond >= MIN_PER_SECOND ? 'ok' : 'MISSED'}`);
    return perSecond >= MIN_PER_SECOND && r.sent === N ? 0 : 1;
  } finally {
    await OutboxMessage.destroy({ where: { feedstockId: f.id } });
    await Subscription.destroy({ where: { feedstockId: f.id } });
    await f.destroy();
    transport.close();
    capture.kill('SIGTERM');
    await new Promise((r) => capture.once('exit', r));
    rmSync(dataDir, { recursive: true, force: true });
    await sequelize.close();
  }
}

main().then((code) => process.exit(code));
