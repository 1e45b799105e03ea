import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { RateLimit, Session, User } from '@/db/models';
import { startCaptureServer, type CaptureServer } from '@/lib/mail/capture-server';
import { firstLink, mailboxDir } from '@/lib/mail/mailbox';
import { startNextHandler } from '../support/next-app';
import { callServerAction, loadBuiltActions } from '../support/server-actions';
import { parseSetCookies } from '../support/sessions';

// The app as it runs on a real site: public address on https, demo mode and
// the mailbox page off. The whole e-mail sign-in goes through Auth.js at the
// protocol level (CSRF token, mail through SMTP, link, session cookie).
describe('sign-in behind an https address, demo mode off', () => {
  const PUBLIC = 'https://trialbed.example';
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let capture: CaptureServer;
  let dataDir: string;
  const email = `https-${Date.now()}@example.test`;

  beforeAll(async () => {
    dataDir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-https-'));
    capture = await startCaptureServer({ port: 0, dir: mailboxDir(dataDir) });
    Object.assign(process.env, {
      AUTH_URL: PUBLIC,
      TRIALBED_DEMO: '0',
      MAILBOX: '0',
      DATA_DIR: dataDir,
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(capture.port),
    });
    await RateLimit.destroy({ where: {} });
    app = await startNextHandler({ listen: true });
  });

  afterAll(async () => {
    await app?.close();
    await capture?.close();
    rmSync(dataDir, { recursive: true, force: true });
    await User.destroy({ where: { email } });
    await sequelize.close();
  });

  it('signs in by e-mail link; the session cookie is __Secure-, HttpOnly, SameSite=Lax and Secure', async () => {
    const csrf = await request(app.server).get('/api/auth/csrf');
    const csrfCookies = parseSetCookies(csrf.headers['set-cookie']);
    const csrfCookie = [...csrfCookies.entries()].find(([name]) => name.endsWith('authjs.csrf-token'))!;
    expect(csrfCookie[0]).toBe('__Host-authjs.csrf-token');
    expect(csrfCookie[1].attrs.secure).toBe(true);

    const arrived = capture.nextMail(email);
    const sent = await request(app.server)
      .post('/api/auth/signin/nodemailer')
      .set('Origin', PUBLIC)
      .set('Cookie', `${csrfCookie[0]}=${csrfCookie[1].value}`)
      .type('form')
      .send({ email, csrfToken: csrf.body.csrfToken, callbackUrl: `${PUBLIC}/account` });
    expect(sent.status).toBe(302);
    expect(sent.headers.location).toBe(`${PUBLIC}/api/auth/verify-request?provider=nodemailer&type=email`);

    const mail = await arrived;
    // mailparser has decoded the quoted-printable text part; the link is whole.
    const link = new URL(firstLink(mail.text)!);
    expect(link.origin).toBe(PUBLIC);
    expect(link.pathname).toBe('/api/auth/callback/nodemailer');

    const callback = await request(app.server).get(`${link.pathname}${link.search}`);
    expect(callback.status).toBe(302);
    expect(callback.headers.location).toBe(`${PUBLIC}/account`);
    const session = parseSetCookies(callback.headers['set-cookie']).get('__Secure-authjs.session-token');
    expect(session, String(callback.headers['set-cookie'])).toBeDefined();
    expect(session!.attrs).toMatchObject({ httponly: true, secure: true, samesite: 'Lax', path: '/' });
    expect(await Session.count({ where: { sessionToken: session!.value } })).toBe(1);

    const me = await request(app.server).get('/api/account').set('Cookie', `__Secure-authjs.session-token=${session!.value}`);
    expect(me.body.account).toMatchObject({ email, role: 'reader', emailVerified: true });
    // The plain cookie name means nothing here.
    const plain = await request(app.server).get('/api/account').set('Cookie', `authjs.session-token=${session!.value}`);
    expect(plain.body.account).toBeNull();
  });

  it('a sign-in link works once', async () => {
    const other = `once-${Date.now()}@example.test`;
    const csrf = await request(app.server).get('/api/auth/csrf');
    const [name, c] = [...parseSetCookies(csrf.headers['set-cookie']).entries()].find(([n]) => n.endsWith('csrf-token'))!;
    const arrived = capture.nextMail(other);
    await request(app.server).post('/api/auth/signin/nodemailer').set('Origin', PUBLIC).set('Cookie', `${name}=${c.value}`).type('form').send({ email: other, csrfToken: csrf.body.csrfToken });
    const link = new URL(firstLink((await arrived).text)!);
    expect((await request(app.server).get(`${link.pathname}${link.search}`)).headers.location).toMatch(/^https:\/\/trialbed\.example\/?$/);
    const again = await request(app.server).get(`${link.pathname}${link.search}`);
    expect(again.headers.location).toBe(`${PUBLIC}/signin?error=Verification`);
    await User.destroy({ where: { email: other } });
  });

  it('refuses the demo shortcut and hides the mailbox when demo mode is off', async () => {
    const action = loadBuiltActions().get('app/signin/actions.ts#signInAsDemo')!;
    const call = await callServerAction(app.baseUrl!, action, { role: 'admin' });
    expect(call.redirect).toBeNull();
    expect(call.result).toMatchObject({ ok: false, code: 'not_found' });
    expect(call.setCookie.filter((c) => c.includes('session-token'))).toEqual([]);

    expect((await request(app.server).get('/dev/mailbox')).status).toBe(404);
    const signin = await request(app.server).get('/signin');
    expect(signin.status).toBe(200);
    expect(signin.text).toContain('E-mail me a sign-in link');
    expect(signin.text).not.toContain('Demo accounts');
  });
});
