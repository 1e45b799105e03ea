import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { RateLimit, Session, User } from '@/db/models';
import { startCaptureServer, type CaptureServer } from '@/lib/mail/capture-server';
import { firstLink, mailboxDir } from '@/lib/mail/mailbox';
import { CHROMIUM_ARGS, startAppProcess } from '../support/app-process';

// A person signs in with an e-mail link in headless Chromium against the
// built app (`next start`) and a capture SMTP server, both on free ports:
// private page → sign-in form → mail → link → signed in → licence → sign out.
describe('sign-in journey in a browser', () => {
  let dataDir: string;
  let capture: CaptureServer;
  let app: Awaited<ReturnType<typeof startAppProcess>>;
  let browser: Browser;
  const email = `e2e-${Date.now()}@example.test`;

  beforeAll(async () => {
    dataDir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-e2e-'));
    capture = await startCaptureServer({ port: 0, dir: mailboxDir(dataDir) });
    await RateLimit.destroy({ where: {} });
    app = await startAppProcess({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(capture.port), DATA_DIR: dataDir, TRIALBED_DEMO: '1' });
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  });

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    await capture?.close();
    rmSync(dataDir, { recursive: true, force: true });
    await User.destroy({ where: { email } });
    await sequelize.close();
  });

  it('signs in by e-mail link, becomes a contributor, and signs out', { timeout: 90_000 }, async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    // Fail with the step that got stuck, not the test timeout.
    context.setDefaultTimeout(10_000);
    const page = await context.newPage();

    // A private page sends a visitor to sign-in, and back afterwards.
    await page.goto(`${app.url}/account`);
    expect(new URL(page.url()).pathname).toBe('/signin');
    expect(new URL(page.url()).searchParams.get('callbackUrl')).toBe('/account');
    await expect(page.getByRole('heading', { level: 1, name: 'Sign in' }).isVisible()).resolves.toBe(true);

    const arrived = capture.nextMail(email);
    await page.getByLabel('E-mail address').fill(email);
    await page.getByRole('button', { name: 'E-mail me a sign-in link' }).click();
    await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
    expect(await page.getByRole('status').textContent()).toContain(email);

    // The link, read from the captured mail (mailparser decoded the quoted-printable text).
    const mail = await arrived;
    const link = firstLink(mail.text)!;
    expect(new URL(link).origin).toBe(app.url);

    // Follow it the way a local user would: through the mailbox page.
    await page.getByRole('link', { name: 'open the local mailbox' }).click();
    await page.getByRole('heading', { level: 1, name: 'Local mailbox' }).waitFor();
    const mailLink = page.locator(`a[href="${link.replace(/"/g, '\\"')}"]`);
    expect(await mailLink.count()).toBe(1);
    await mailLink.click();

    await page.waitForURL(`${app.url}/account`);
    await page.getByRole('heading', { level: 1, name: 'Your account' }).waitFor();
    expect(await page.locator('main').textContent()).toContain(email);
    expect(await page.locator('main').textContent()).toMatch(/Role\s*reader/i);
    await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).waitFor();

    // The session cookie: HttpOnly, SameSite=Lax, not Secure on http://localhost.
    const cookie = (await context.cookies()).find((c) => c.name === 'authjs.session-token');
    expect(cookie).toMatchObject({ httpOnly: true, sameSite: 'Lax', secure: false, path: '/' });
    expect(await page.evaluate(() => document.cookie)).not.toContain('authjs.session-token');

    // A reader accepts the contribution licence.
    await page.getByLabel(/I agree that the text and data I contribute/).check();
    await page.getByRole('button', { name: 'Accept and become a contributor' }).click();
    // The page re-renders with the new role and the date of acceptance.
    await page.getByText('You accepted the contribution licence on').waitFor();
    expect(await page.locator('main').textContent()).toMatch(/Role\s*contributor/i);
    expect((await User.findOne({ where: { email } }))?.role).toBe('contributor');

    // Sign out from the header.
    await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(`${app.url}/signin?signed-out=1`);
    await page.getByText('You are signed out.').waitFor();
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
    expect((await context.cookies()).find((c) => c.name === 'authjs.session-token')).toBeUndefined();
    expect(await Session.count({ where: { sessionToken: cookie!.value } })).toBe(0);

    await page.goto(`${app.url}/account`);
    expect(new URL(page.url()).pathname).toBe('/signin');
    await context.close();
  });
});
