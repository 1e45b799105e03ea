import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Proposal, RateLimit, Trial, User } from '@/db/models';
import { sequelize } from '@/db';
import { startCaptureServer, type CaptureServer } from '@/lib/mail/capture-server';
import { listRouteHandlers, listServerActions, listStrayServerFunctions } from '../support/app-inventory';
import { buildUser } from '../support/factories';
import { startNextHandler } from '../support/next-app';
import { callServerAction, loadBuiltActions, type BuiltAction } from '../support/server-actions';
import { openSession } from '../support/sessions';
import { ACTION_ROWS, ROUTE_ROWS, WHO, type ActionOutcome, type Cell, type Who } from './authorization-matrix.table';

// Every route handler and server action × every role (and anonymous), through
// the real Next.js handler with real database sessions. The table is in
// ./authorization-matrix.table.ts; this file fails when the app has a route
// handler or server action the table does not list.
describe('authorization matrix', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let baseUrl: string;
  let capture: CaptureServer;
  let mailDir: string;
  let builtActions: Map<string, BuiltAction>;
  const created: User[] = [];

  const makeUser = async (attrs: { role?: User['role'] } = {}) => {
    const u = await buildUser({ role: attrs.role ?? 'reader' });
    created.push(u);
    return u;
  };

  /** A fresh caller for one cell: a new user of that role with a real session (none for anonymous). */
  async function cellFor(who: Who): Promise<Cell & { cookie?: string }> {
    if (who === 'anonymous') return { who, user: null, makeUser };
    const user = await makeUser({ role: who });
    return { who, user, makeUser, cookie: (await openSession(user)).cookie };
  }

  beforeAll(async () => {
    mailDir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-matrix-mail-'));
    capture = await startCaptureServer({ port: 0, dir: mailDir });
    process.env.SMTP_HOST = '127.0.0.1';
    process.env.SMTP_PORT = String(capture.port);
    // Sign-in mail counts against per-client limits; start from a clean slate.
    await RateLimit.destroy({ where: {} });
    app = await startNextHandler({ listen: true });
    baseUrl = app.baseUrl!;
    builtActions = loadBuiltActions();
  });

  afterAll(async () => {
    await app?.close();
    await capture?.close();
    rmSync(mailDir, { recursive: true, force: true });
    const ids = created.map((u) => u.id);
    // Rows the matrix made that point at its users (RESTRICT keys) go first.
    await Proposal.destroy({ where: { authorId: ids } });
    await Trial.destroy({ where: { ownerId: ids } });
    await User.destroy({ where: { id: ids } });
    await sequelize.close();
  });

  it('lists every route handler and server action of the app, and nothing that is gone', () => {
    const routes = listRouteHandlers();
    const actions = listServerActions();
    const routeRows = ROUTE_ROWS.map((r) => r.route);
    const actionRows = ACTION_ROWS.map((r) => r.action);
    expect(routes.filter((r) => !routeRows.includes(r)), 'route handlers without a row in the matrix').toEqual([]);
    expect(actions.filter((a) => !actionRows.includes(a)), 'server actions without a row in the matrix').toEqual([]);
    expect(routeRows.filter((r) => !routes.includes(r)), 'matrix rows for route handlers that do not exist').toEqual([]);
    expect(actionRows.filter((a) => !actions.includes(a)), 'matrix rows for server actions that do not exist').toEqual([]);
    expect(new Set(routeRows).size).toBe(routeRows.length);
    expect(new Set(actionRows).size).toBe(actionRows.length);
  });

  it("keeps server functions in app/**/actions.ts only (the matrix's convention)", () => {
    expect(listStrayServerFunctions()).toEqual([]);
  });

  describe.each(ROUTE_ROWS)('$route', (row) => {
    it.each(WHO.map((who) => [who, row.expect[who]] as const))('as %s → %i', async (who, status) => {
      const cell = await cellFor(who);
      const req = await row.request(cell);
      const [method, pattern] = row.route.split(' ');
      let test = request(app.server)[method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete'](req.path);
      if (method !== 'GET' && method !== 'HEAD') test = test.set('Origin', baseUrl);
      if (cell.cookie) test = test.set('Cookie', cell.cookie);
      const res = req.json !== undefined ? await test.send(req.json as object) : req.form ? await test.type('form').send(req.form) : await test;
      expect(res.status, `${method} ${req.path} (${pattern}) as ${who}: ${JSON.stringify(res.body)}`).toBe(status);
      if (status >= 400 && res.headers['content-type']?.includes('json')) expect(res.body.error?.code).toBeTypeOf('string');
      await row.check?.(cell, { allowed: status < 300, status, body: res.body });
    });
  });

  describe.each(ACTION_ROWS)('$action', (row) => {
    it.each(WHO.map((who) => [who, row.expect[who]] as const))('as %s → %s', async (who, expected) => {
      const built = builtActions.get(row.action);
      expect(built, `${row.action} is not in the build (no page uses it?)`).toBeDefined();
      const cell = await cellFor(who);
      const call = await callServerAction(baseUrl, built!, await row.fields(cell), { cookie: cell.cookie });
      expect(call.status, JSON.stringify(call.result)).toBeLessThan(500);
      const state = call.result as { ok?: boolean; code?: string } | undefined;
      const outcome: ActionOutcome = call.redirect || state?.ok ? 'ok' : ((state?.code ?? 'unknown') as ActionOutcome);
      expect(outcome, `${row.action} as ${who}: ${JSON.stringify(call.result)}`).toBe(expected);
      await row.check?.(cell, { allowed: outcome === 'ok', outcome });
    });
  });
});
