import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Op } from 'sequelize';
import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { AuditLog, RateLimit, Session, User, VerificationToken } from '@/db/models';
import { startCaptureServer, type CaptureServer } from '@/lib/mail/capture-server';
import { listCapturedMail, mailboxDir } from '@/lib/mail/mailbox';
import { SIGN_IN_MAIL_LIMITS } from '@/lib/services/rate-limits';
import { buildUser } from '../support/factories';
import { startNextHandler } from '../support/next-app';
import { callServerAction, loadBuiltActions } from '../support/server-actions';
import { openSession, parseSetCookies } from '../support/sessions';

// Accounts, roles and sign-in through the real Next.js handler and MariaDB:
// bad input, cross-site requests, sign-in mail limits, the audit log, and the
// rules that keep Trialbed from locking its admins out.
describe('accounts and roles over HTTP', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let baseUrl: string;
  let capture: CaptureServer;
  let mailDir: string;
  let dataDir: string;
  const created: string[] = [];
  // Requests from a browser on this site carry its Origin; AUTH_URL is the public address.
  const ORIGIN = new URL(process.env.AUTH_URL ?? 'http://localhost:3000').origin;

  const user = async (role: User['role'], attrs: Parameters<typeof buildUser>[0] = {}) => {
    const u = await buildUser({ role, ...attrs });
    created.push(u.id);
    return u;
  };
  const signedIn = async (role: User['role']) => {
    const u = await user(role);
    return { user: u, cookie: (await openSession(u)).cookie };
  };
  const auditFor = (subjectId: string) => AuditLog.findAll({ where: { subjectType: 'user', subjectId }, order: [['id', 'ASC']] });
  const uniqueIp = () => `198.51.100.${Math.floor(Math.random() * 250) + 1}, 203.0.113.${Math.floor(Math.random() * 250) + 1}`;

  /** Runs `fn` while the given users are the only active admins, then restores the others. */
  async function withOnlyAdmins(ids: string[], fn: () => Promise<void>) {
    const others = await User.findAll({ where: { role: 'admin', disabledAt: null, id: { [Op.notIn]: ids } } });
    await User.update({ disabledAt: new Date() }, { where: { id: others.map((u) => u.id) } });
    try {
      await fn();
    } finally {
      await User.update({ disabledAt: null }, { where: { id: others.map((u) => u.id) } });
    }
  }

  beforeAll(async () => {
    dataDir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-accounts-'));
    mailDir = mailboxDir(dataDir);
    capture = await startCaptureServer({ port: 0, dir: mailDir });
    process.env.SMTP_HOST = '127.0.0.1';
    process.env.SMTP_PORT = String(capture.port);
    // The app's /dev/mailbox reads DATA_DIR/mailbox, where this capture server writes.
    process.env.DATA_DIR = dataDir;
    app = await startNextHandler({ listen: true });
    baseUrl = app.baseUrl!;
  });
  beforeEach(async () => {
    await RateLimit.destroy({ where: {} });
  });
  afterAll(async () => {
    await app?.close();
    await capture?.close();
    rmSync(dataDir, { recursive: true, force: true });
    await User.destroy({ where: { id: created } });
    await sequelize.close();
  });

  describe('bad input gets 400 with field messages, and nothing is written', () => {
    it('a malformed or missing address on the e-mail sign-in POST', async () => {
      const email = 'someone@';
      const bad = await request(app.server).post('/api/auth/signin/nodemailer').set('Origin', ORIGIN).type('form').send({ email, csrfToken: 'x' });
      expect(bad.status).toBe(400);
      expect(bad.body.error.code).toBe('invalid_input');
      expect(bad.body.error.fieldErrors.email[0]).toMatch(/e-mail address/);
      const missing = await request(app.server).post('/api/auth/signin/nodemailer').set('Origin', ORIGIN).type('form').send({ csrfToken: 'x' });
      expect(missing.status).toBe(400);
      expect(missing.body.error.fieldErrors.email).toBeDefined();
      expect(await VerificationToken.count({ where: { identifier: email } })).toBe(0);
      expect(await User.count({ where: { email } })).toBe(0);
      expect(listCapturedMail(mailDir, { to: email })).toEqual([]);
    });

    it('the sign-in form (server action) names the field too', async () => {
      const action = loadBuiltActions().get('app/signin/actions.ts#requestSignInLink')!;
      const call = await callServerAction(baseUrl, action, { email: 'not an address' });
      expect(call.result).toMatchObject({ ok: false, code: 'invalid_input', fieldErrors: { email: [expect.stringMatching(/e-mail address/)] } });
    });

    it('an unknown role, an empty change, a body that is not JSON, a bad user id', async () => {
      const admin = await signedIn('admin');
      const target = await user('contributor');
      const patch = () => request(app.server).patch(`/api/admin/users/${target.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie);

      const unknownRole = await patch().send({ role: 'overlord' });
      expect(unknownRole.status).toBe(400);
      expect(unknownRole.body.error.fieldErrors.role[0]).toMatch(/reader, contributor, editor, moderator, admin/);

      const empty = await patch().send({});
      expect(empty.status).toBe(400);
      expect(empty.body.error.fieldErrors.role[0]).toMatch(/Send a role, disabled, or both/);

      const notBoolean = await patch().send({ disabled: 'perhaps' });
      expect(notBoolean.status).toBe(400);
      expect(notBoolean.body.error.fieldErrors.disabled).toBeDefined();

      const notJson = await patch().set('Content-Type', 'application/json').send('{"role": ');
      expect(notJson.status).toBe(400);

      const badId = await request(app.server).patch('/api/admin/users/not-a-uuid').set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ role: 'editor' });
      expect(badId.status).toBe(404);

      await target.reload();
      expect(target.role).toBe('contributor');
      expect(target.disabledAt).toBeNull();
      expect(await auditFor(target.id)).toHaveLength(0);
    });

    it('units and licence with missing or unknown values', async () => {
      const reader = await signedIn('reader');
      const units = await request(app.server).patch('/api/account').set('Origin', ORIGIN).set('Cookie', reader.cookie).send({ units: 'furlongs' });
      expect(units.status).toBe(400);
      expect(units.body.error.fieldErrors.units).toEqual(['Choose metric or imperial.']);
      const licence = await request(app.server).post('/api/account/licence').set('Origin', ORIGIN).set('Cookie', reader.cookie).send({});
      expect(licence.status).toBe(400);
      expect(licence.body.error.fieldErrors.accept[0]).toMatch(/Tick the box/);
      await reader.user.reload();
      expect(reader.user.units).toBe('metric');
      expect(reader.user.role).toBe('reader');
    });
  });

  describe('a state-changing request from a foreign origin is refused', () => {
    it('JSON routes answer 403 to a foreign Origin, Origin: null and Sec-Fetch-Site: cross-site', async () => {
      const reader = await signedIn('reader');
      const tries = [
        request(app.server).patch('/api/account').set('Origin', 'https://evil.example').set('Cookie', reader.cookie).send({ units: 'imperial' }),
        request(app.server).patch('/api/account').set('Origin', 'null').set('Cookie', reader.cookie).send({ units: 'imperial' }),
        request(app.server).patch('/api/account').set('Sec-Fetch-Site', 'cross-site').set('Cookie', reader.cookie).send({ units: 'imperial' }),
        request(app.server).post('/api/account/licence').set('Origin', 'https://evil.example').set('Cookie', reader.cookie).send({ accept: true }),
      ];
      for (const res of await Promise.all(tries)) {
        expect(res.status).toBe(403);
        expect(res.body.error).toMatchObject({ code: 'forbidden', message: 'Cross-site request refused.' });
      }
      await reader.user.reload();
      expect(reader.user.units).toBe('metric');
      expect(reader.user.role).toBe('reader');
      // The same request from this site goes through.
      const ok = await request(app.server).patch('/api/account').set('Origin', ORIGIN).set('Sec-Fetch-Site', 'same-origin').set('Cookie', reader.cookie).send({ units: 'imperial' });
      expect(ok.status).toBe(200);
    });

    it('an admin change from another site is refused', async () => {
      const admin = await signedIn('admin');
      const target = await user('contributor');
      const res = await request(app.server)
        .patch(`/api/admin/users/${target.id}`)
        .set('Origin', 'https://evil.example')
        .set('Cookie', admin.cookie)
        .send({ role: 'admin' });
      expect(res.status).toBe(403);
      await target.reload();
      expect(target.role).toBe('contributor');
      expect(await auditFor(target.id)).toHaveLength(0);
    });

    it('the Auth.js sign-in POST from another site sends no mail', async () => {
      const email = `csrf-${Date.now()}@example.test`;
      const res = await request(app.server).post('/api/auth/signin/nodemailer').set('Origin', 'https://evil.example').type('form').send({ email, csrfToken: 'x' });
      expect(res.status).toBe(403);
      expect(await VerificationToken.count({ where: { identifier: email } })).toBe(0);
    });

    it('saving units on the account page also sets the units cookie the pages read in the browser', async () => {
      const reader = await signedIn('reader');
      const action = loadBuiltActions().get('app/account/actions.ts#saveUnits')!;
      const call = await callServerAction(baseUrl, action, { units: 'imperial' }, { cookie: reader.cookie });
      expect(call.result).toMatchObject({ ok: true });
      await reader.user.reload();
      expect(reader.user.units).toBe('imperial');
      expect(parseSetCookies(call.setCookie).get('units')?.value).toBe('imperial');
    });

    it('a server action called from another site does not run (Next.js checks Origin against Host)', async () => {
      const reader = await signedIn('reader');
      const action = loadBuiltActions().get('app/account/actions.ts#saveUnits')!;
      const call = await callServerAction(baseUrl, action, { units: 'imperial' }, { cookie: reader.cookie, origin: 'https://evil.example' });
      expect(call.status).toBe(500);
      expect(call.result).not.toMatchObject({ ok: true });
      await reader.user.reload();
      expect(reader.user.units).toBe('metric');
    });
  });

  describe('sign-in mail rate limits (shared through MariaDB)', () => {
    const post = (email: string, ip: string) =>
      // No CSRF token: Auth.js refuses to send after our guard has counted the attempt, so no mail goes out.
      request(app.server).post('/api/auth/signin/nodemailer').set('Origin', ORIGIN).set('X-Forwarded-For', ip).type('form').send({ email, csrfToken: 'x' });

    it('per address: the attempt after the limit gets 429 with Retry-After and a clear message', async () => {
      const email = `limit-${Date.now()}@example.test`;
      for (let i = 0; i < SIGN_IN_MAIL_LIMITS.perAddress.max; i++) {
        // Different clients, one address.
        expect((await post(email, uniqueIp())).status).not.toBe(429);
      }
      const res = await post(email.toUpperCase(), uniqueIp()); // the same address however it is typed
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('rate_limited');
      expect(res.body.error.message).toMatch(/Too many sign-in e-mails for this address/);
      const retry = Number(res.headers['retry-after']);
      expect(retry).toBeGreaterThan(0);
      expect(retry).toBeLessThanOrEqual(SIGN_IN_MAIL_LIMITS.perAddress.windowSeconds);

      // The sign-in form's server action shares the limit.
      const action = loadBuiltActions().get('app/signin/actions.ts#requestSignInLink')!;
      const call = await callServerAction(baseUrl, action, { email });
      expect(call.result).toMatchObject({ ok: false, code: 'rate_limited' });
    });

    it('per client: many addresses from one network are cut off after the limit', async () => {
      const ip = uniqueIp();
      for (let i = 0; i < SIGN_IN_MAIL_LIMITS.perClient.max; i++) {
        expect((await post(`client-${i}-${Date.now()}@example.test`, ip)).status).not.toBe(429);
      }
      const res = await post(`client-last-${Date.now()}@example.test`, ip);
      expect(res.status).toBe(429);
      expect(res.body.error.message).toMatch(/from your network/);
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
      // Another client is not affected.
      expect((await post(`client-other-${Date.now()}@example.test`, uniqueIp())).status).not.toBe(429);
    });

    it('stores only hashes, never the address', async () => {
      const email = `hashed-${Date.now()}@example.test`;
      await post(email, uniqueIp());
      const rows = await RateLimit.findAll();
      expect(rows.length).toBeGreaterThan(0);
      for (const r of rows) expect(r.bucket).not.toContain(email);
    });
  });

  describe('roles, disabling and the audit log', () => {
    it('a role change writes an audit row naming the admin, old and new role', async () => {
      const admin = await signedIn('admin');
      const target = await user('contributor');
      const res = await request(app.server).patch(`/api/admin/users/${target.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ role: 'editor' });
      expect(res.status).toBe(200);
      expect(res.body.user).toMatchObject({ id: target.id, role: 'editor', disabled: false });
      const rows = await auditFor(target.id);
      expect(rows.map((r) => [r.action, r.actorId, r.details])).toEqual([['user.role-change', admin.user.id, { from: 'contributor', to: 'editor' }]]);
    });

    it('disabling signs the person out everywhere, is audited, and enabling is audited too', async () => {
      const admin = await signedIn('admin');
      const target = await signedIn('moderator');
      expect((await request(app.server).get('/api/account').set('Cookie', target.cookie)).body.account.role).toBe('moderator');

      const off = await request(app.server).patch(`/api/admin/users/${target.user.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ disabled: true });
      expect(off.status).toBe(200);
      expect(await Session.count({ where: { userId: target.user.id } })).toBe(0);
      expect((await request(app.server).get('/api/account').set('Cookie', target.cookie)).body.account).toBeNull();

      const on = await request(app.server).patch(`/api/admin/users/${target.user.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ disabled: false });
      expect(on.status).toBe(200);
      expect((await auditFor(target.user.id)).map((r) => r.action)).toEqual(['user.disable', 'user.enable']);
    });

    it('a disabled account with a live session counts as a visitor everywhere', async () => {
      const person = await signedIn('editor');
      await person.user.update({ disabledAt: new Date() });
      expect((await request(app.server).get('/api/account').set('Cookie', person.cookie)).body).toEqual({ account: null });
      const res = await request(app.server).patch('/api/account').set('Origin', ORIGIN).set('Cookie', person.cookie).send({ units: 'imperial' });
      expect(res.status).toBe(401);
    });

    it('an admin cannot disable their own account', async () => {
      const admin = await signedIn('admin');
      const res = await request(app.server).patch(`/api/admin/users/${admin.user.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ disabled: true });
      expect(res.status).toBe(403);
      expect(res.body.error.message).toMatch(/cannot disable your own account/);
      await admin.user.reload();
      expect(admin.user.disabledAt).toBeNull();
      expect(await auditFor(admin.user.id)).toHaveLength(0);
    });

    it('the last active admin cannot demote themselves; with another admin they can', async () => {
      const admin = await signedIn('admin');
      await withOnlyAdmins([admin.user.id], async () => {
        const res = await request(app.server).patch(`/api/admin/users/${admin.user.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ role: 'moderator' });
        expect(res.status).toBe(409);
        expect(res.body.error.message).toMatch(/at least one active admin/);
        await admin.user.reload();
        expect(admin.user.role).toBe('admin');
      });
      const second = await user('admin');
      await withOnlyAdmins([admin.user.id, second.id], async () => {
        const res = await request(app.server).patch(`/api/admin/users/${admin.user.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ role: 'moderator' });
        expect(res.status).toBe(200);
      });
      expect((await auditFor(admin.user.id)).map((r) => r.details)).toEqual([{ from: 'admin', to: 'moderator' }]);
    });

    it('two admins demoting each other at once leave one admin, never none', async () => {
      const a = await signedIn('admin');
      const b = await signedIn('admin');
      await withOnlyAdmins([a.user.id, b.user.id], async () => {
        const [ra, rb] = await Promise.all([
          request(app.server).patch(`/api/admin/users/${b.user.id}`).set('Origin', ORIGIN).set('Cookie', a.cookie).send({ role: 'editor' }),
          request(app.server).patch(`/api/admin/users/${a.user.id}`).set('Origin', ORIGIN).set('Cookie', b.cookie).send({ role: 'editor' }),
        ]);
        expect([ra.status, rb.status].sort()).toEqual([200, expect.any(Number)]);
        expect([ra.status, rb.status].filter((s) => s === 200)).toHaveLength(1);
        expect([ra.status, rb.status].find((s) => s !== 200)).toBeGreaterThanOrEqual(403);
        expect(await User.count({ where: { id: [a.user.id, b.user.id], role: 'admin', disabledAt: null } })).toBe(1);
      });
    });

    it('a role above reader needs the contribution licence first', async () => {
      const admin = await signedIn('admin');
      const reader = await user('reader');
      const res = await request(app.server).patch(`/api/admin/users/${reader.id}`).set('Origin', ORIGIN).set('Cookie', admin.cookie).send({ role: 'editor' });
      expect(res.status).toBe(400);
      expect(res.body.error.fieldErrors.role[0]).toMatch(/contribution licence/);
      await reader.reload();
      expect(reader.role).toBe('reader');
    });

    it('a reader with a confirmed e-mail accepts the licence and becomes a contributor (audited); an unconfirmed one cannot', async () => {
      const reader = await signedIn('reader');
      const res = await request(app.server).post('/api/account/licence').set('Origin', ORIGIN).set('Cookie', reader.cookie).send({ accept: true });
      expect(res.status).toBe(200);
      expect(res.body.role).toBe('contributor');
      await reader.user.reload();
      expect(reader.user.licenceAcceptedAt).toBeInstanceOf(Date);
      expect((await auditFor(reader.user.id)).map((r) => [r.action, r.details])).toEqual([
        ['licence.accept', { licence: 'CC BY-SA 4.0', from: 'reader', to: 'contributor' }],
      ]);

      const unconfirmed = await user('reader');
      await unconfirmed.update({ emailVerified: null });
      const { cookie } = await openSession(unconfirmed);
      const refused = await request(app.server).post('/api/account/licence').set('Origin', ORIGIN).set('Cookie', cookie).send({ accept: true });
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toMatch(/Confirm your e-mail address first/);
    });

    it('the admin list finds people by e-mail and shows no secrets', async () => {
      const admin = await signedIn('admin');
      const target = await user('reader', { email: `findme-${Date.now()}@example.test` });
      const res = await request(app.server).get(`/api/admin/users?q=${encodeURIComponent(target.email!)}`).set('Cookie', admin.cookie);
      expect(res.status).toBe(200);
      expect(res.body.users).toHaveLength(1);
      expect(Object.keys(res.body.users[0]).sort()).toEqual(['disabled', 'email', 'emailVerified', 'id', 'isDemo', 'isSelf', 'joinedAt', 'licenceAccepted', 'name', 'role']);
      const bad = await request(app.server).get('/api/admin/users?page=zero').set('Cookie', admin.cookie);
      expect(bad.status).toBe(400);
      expect(bad.body.error.fieldErrors.page).toBeDefined();
    });
  });

  describe('demo mode (on in the test environment)', () => {
    it('a demo account signs in without mail; the cookie is the Auth.js one, HttpOnly and SameSite=Lax', async () => {
      const action = loadBuiltActions().get('app/signin/actions.ts#signInAsDemo')!;
      const call = await callServerAction(baseUrl, action, { role: 'moderator' });
      expect(call.redirect).toBe('/account');
      const cookie = parseSetCookies(call.setCookie).get('authjs.session-token');
      expect(cookie).toBeDefined();
      // AUTH_URL is http in tests, so not Secure; behind https it is (auth-production.test.ts).
      expect(cookie!.attrs).toMatchObject({ httponly: true, samesite: 'lax', path: '/' });
      expect(cookie!.attrs.secure).toBeUndefined();
      const me = await request(app.server).get('/api/account').set('Cookie', `authjs.session-token=${cookie!.value}`);
      expect(me.body.account).toMatchObject({ role: 'moderator', isDemo: true });
      // Auth.js treats it like its own: signing out deletes the row.
      const out = await callServerAction(baseUrl, loadBuiltActions().get('app/signin/actions.ts#signOutUser')!, {}, { cookie: `authjs.session-token=${cookie!.value}` });
      expect(out.redirect).toBe('/signin?signed-out=1');
      expect(await Session.count({ where: { sessionToken: cookie!.value } })).toBe(0);
    });

    it('switching to a demo account ends the current session', async () => {
      const person = await user('contributor');
      const { token, cookie } = await openSession(person);
      const call = await callServerAction(baseUrl, loadBuiltActions().get('app/signin/actions.ts#signInAsDemo')!, { role: 'editor' }, { cookie });
      expect(call.redirect).toBe('/account');
      expect(await Session.count({ where: { sessionToken: token } })).toBe(0);
      const fresh = parseSetCookies(call.setCookie).get('authjs.session-token');
      expect(fresh?.value).toBeTruthy();
      expect(fresh!.value).not.toBe(token);
      expect((await request(app.server).get('/api/account').set('Cookie', `authjs.session-token=${fresh!.value}`)).body.account.role).toBe('editor');
    });

    it('an unknown demo role is refused with a field message', async () => {
      const action = loadBuiltActions().get('app/signin/actions.ts#signInAsDemo')!;
      const call = await callServerAction(baseUrl, action, { role: 'overlord' });
      expect(call.result).toMatchObject({ ok: false, code: 'invalid_input', fieldErrors: { role: [expect.stringMatching(/Choose one of/)] } });
    });

    it('shows a sign-in mail sent through the sign-in form, with its link', async () => {
      const email = `mailbox-${Date.now()}@example.test`;
      const action = loadBuiltActions().get('app/signin/actions.ts#requestSignInLink')!;
      const arrived = capture.nextMail(email);
      const call = await callServerAction(baseUrl, action, { email, callbackUrl: '/account' });
      expect(call.result).toMatchObject({ ok: true, email });
      const mail = await arrived;
      expect(mail.subject).toBe('Your Trialbed sign-in link');
      const page = await request(app.server).get('/dev/mailbox');
      expect(page.status).toBe(200);
      expect(page.text).toContain(email);
      expect(page.text).toContain('/api/auth/callback/nodemailer?');
    });
  });
});
