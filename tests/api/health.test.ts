import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureDatabase, freePort, startMariaDB, type MariaDBServer } from "../../db/server/mariadb.mjs";
import { startNextHandler } from '../support/next-app';

// /api/health through the real Next.js handler, against a MariaDB of its own
// that this test stops half-way (the shared test database stays up).
describe('GET /api/health', () => {
  let dir: string;
  let db: MariaDBServer;
  let app: Awaited<ReturnType<typeof startNextHandler>>;

  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-health-'));
    const port = await freePort();
    db = await startMariaDB({ dataDir: dir, port });
    ensureDatabase(db, { name: 'health_probe', user: 'probe', password: 'probe-pw' });
    Object.assign(process.env, { DB_PORT: String(port), DB_NAME: 'health_probe', DB_USER: 'probe', DB_PASSWORD: 'probe-pw' });
    app = await startNextHandler();
  });

  afterAll(async () => {
    await app?.close();
    await db?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('answers 200 while the database answers, then 503 once it is stopped', async () => {
    const up = await request(app.server).get('/api/health');
    expect(up.status).toBe(200);
    expect(up.body).toMatchObject({ status: 'ok', database: { ok: true } });
    expect(up.headers['cache-control']).toContain('no-store');

    await db.stop();
    const down = await request(app.server).get('/api/health');
    expect(down.status).toBe(503);
    expect(down.body).toMatchObject({ status: 'degraded', database: { ok: false } });
  });
});
