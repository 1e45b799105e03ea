import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Transporter } from 'nodemailer';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, PublishedVerdict, RateLimit, Subscription, User } from '@/db/models';
import { startCaptureServer, type CaptureServer } from '@/lib/mail/capture-server';
import { firstLink, headerValues, listCapturedMail, mailboxDir } from '@/lib/mail/mailbox';
import { drainOutbox } from '@/lib/mail/outbox-worker';
import { createProposal, decideProposal } from '@/lib/services/proposals';
import { CHROMIUM_ARGS, startAppProcess } from '../support/app-process';
import { buildFeedstock, buildUser } from '../support/factories';
import { actorOf, captureTransport, cleanUpMailFixtures } from '../support/mail';
import { openSession } from '../support/sessions';

const DAY = 86_400_000;
// Screenshots for looking at the pages as a person would (375 px phone, 1280 px desktop); not asserted.
const SHOTS = path.join(process.cwd(), 'test-artifacts', 'subscribe');

// A visitor follows a feedstock by e-mail in headless Chromium against the
// built app (`next start`) and a capture SMTP server, both on free ports:
// subscribe form → confirmation mail → link → confirm → an update happens →
// the worker runs once → the update mail arrives → one-click unsubscribe page.
describe('following a feedstock by e-mail in a browser', () => {
  let dataDir: string;
  let capture: CaptureServer;
  let transport: Transporter;
  let app: Awaited<ReturnType<typeof startAppProcess>>;
  let browser: Browser;
  let f: Feedstock;
  let author: User;
  let moderator: User;
  const email = `e2e-follow-${Date.now()}@example.test`;

  const shoot = async (page: Page, name: string) => {
    for (const width of [375, 1280]) {
      await page.setViewportSize({ width, height: 900 });
      await page.screenshot({ path: path.join(SHOTS, `${name}-${width}.png`), fullPage: true });
    }
    await page.setViewportSize({ width: 1280, height: 900 });
  };

  /** Waits until React has hydrated the page's buttons (a click before that would post the form without JavaScript). */
  const hydrated = (page: Page) =>
    page.waitForFunction(() => {
      const buttons = [...document.querySelectorAll('main button')];
      return buttons.length > 0 && buttons.every((b) => Object.keys(b).some((k) => k.startsWith('__reactProps')));
    });

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    dataDir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-e2e-follow-'));
    capture = await startCaptureServer({ port: 0, dir: mailboxDir(dataDir) });
    transport = captureTransport(capture.port);
    await RateLimit.destroy({ where: {} });
    author = await buildUser({ role: 'contributor', createdAt: new Date(Date.now() - 30 * DAY) });
    moderator = await buildUser({ role: 'moderator', createdAt: new Date(Date.now() - 30 * DAY) });
    f = await buildFeedstock({ name: 'Orange peel (browser test)' });
    await PublishedVerdict.create({ feedstockId: f.id, setting: 'bed', verdict: 'avoid', ceilingKgM2: null, cautions: [], proposalId: null, publishedAt: new Date() });
    app = await startAppProcess({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(capture.port), DATA_DIR: dataDir, TRIALBED_DEMO: '1' });
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  });

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    transport?.close();
    await capture?.close();
    rmSync(dataDir, { recursive: true, force: true });
    await Subscription.destroy({ where: { email } });
    await cleanUpMailFixtures({ feedstocks: f ? [f] : [] });
    await sequelize.query('DELETE FROM audit_log WHERE actor_id IN (?)', { replacements: [[author.id, moderator.id]] });
    await User.destroy({ where: { id: [author.id, moderator.id] } });
    await sequelize.close();
  });

  it('subscribes by e-mail, confirms from the mail, receives the next update and unsubscribes in one click', { timeout: 120_000 }, async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    context.setDefaultTimeout(15_000);
    const page = await context.newPage();

    // 1. The subscribe panel on the feedstock's follow page.
    await page.goto(`${app.url}/feedstocks/${f.slug}/subscribe`);
    await page.getByRole('heading', { level: 2, name: `Follow ${f.name} by e-mail` }).waitFor();
    await page.getByLabel('Your e-mail address').waitFor();
    await shoot(page, '1-subscribe-form');
    await page.getByLabel('Your e-mail address').fill(email);
    await page.getByLabel(/Each update as it happens/).check();
    const confirmation = capture.nextMail(email);
    await page.getByRole('button', { name: 'E-mail me a confirmation link' }).click();
    await page.getByText('Check your e-mail').waitFor();
    expect(await page.getByRole('status').textContent()).toContain(email);
    await shoot(page, '2-check-email');
    // Double opt-in: nothing counts yet.
    expect((await Subscription.findOne({ where: { feedstockId: f.id, email } }))!.confirmedAt).toBeNull();

    // 2. The confirmation link from the captured mail (mailparser decoded it).
    const link = firstLink((await confirmation).text)!;
    expect(new URL(link).origin).toBe(app.url);
    await page.goto(link);
    await page.getByRole('heading', { level: 1, name: 'Confirm your subscription' }).waitFor();
    await hydrated(page);
    await shoot(page, '3-confirm');
    await page.getByRole('button', { name: `Confirm: follow ${f.name}` }).click();
    await page.getByText(`Confirmed: you follow ${f.name}`).waitFor();
    expect((await Subscription.findOne({ where: { feedstockId: f.id, email } }))!.confirmedAt).toBeInstanceOf(Date);

    // 3. An update happens (a proposal opened and approved through the services); the worker runs once.
    const { id } = await createProposal(actorOf(author), {
      feedstockId: f.id,
      settings: [{ setting: 'bed', verdict: 'limit', ceilingKgM2: 5, cautions: ['heating'] }],
      rationale: 'Open-bed trials up to 5 kg/m² were eaten within five weeks.',
    });
    await decideProposal(actorOf(moderator), id, { decision: 'approve', note: 'Matches the trials.' });
    await drainOutbox({ transport, baseUrl: app.url, log: () => {} });
    const mails = listCapturedMail(capture.dir, { to: email }).reverse();
    expect(mails.map((m) => m.subject).sort()).toEqual([`${f.name}: new verdict published`, `${f.name}: verdict proposal opened`, `Confirm: follow ${f.name} on Trialbed`].sort());
    const update = mails.find((m) => m.subject === `${f.name}: new verdict published`)!;
    expect(update.text).toContain(`What changed: Keep out → Small amounts only in open beds, after proposal ${id}.`);
    expect(update.text).toContain(`${app.url}/feedstocks/${f.slug}`);
    expect(update.text).toContain(`You get this because you follow ${f.name} on Trialbed`);
    expect(headerValues(update, 'List-Unsubscribe-Post')).toEqual(['List-Unsubscribe=One-Click']);
    const unsubscribeUrl = headerValues(update, 'List-Unsubscribe')[0].match(/^<([^>]+)>$/)![1];

    // 4. The unsubscribe link opened in a browser: a page with a button; only the button unsubscribes.
    await page.goto(unsubscribeUrl);
    await page.getByRole('heading', { level: 1, name: 'Unsubscribe' }).waitFor();
    await hydrated(page);
    expect(new URL(page.url()).pathname).toBe('/unsubscribe');
    expect((await Subscription.findOne({ where: { feedstockId: f.id, email } }))!.unsubscribedAt).toBeNull();
    await shoot(page, '4-unsubscribe');
    await page.getByRole('button', { name: 'Unsubscribe' }).click();
    await page.getByText(`gets no more mail about ${f.name}`).waitFor();
    await shoot(page, '5-unsubscribed');
    expect((await Subscription.findOne({ where: { feedstockId: f.id, email } }))!.unsubscribedAt).toBeInstanceOf(Date);
    await context.close();
  });

  it('a signed-in reader follows in one click and manages it on the account page', { timeout: 90_000 }, async () => {
    const reader = await buildUser({ role: 'reader' });
    try {
      const session = await openSession(reader);
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      context.setDefaultTimeout(15_000);
      await context.addCookies([session.browserCookie(app.url)]);
      const page = await context.newPage();
      await page.goto(`${app.url}/feedstocks/${f.slug}/subscribe`);
      await page.getByText(`Mail goes to ${reader.email}`).waitFor();
      await page.getByLabel(/A weekly digest/).check();
      await page.getByRole('button', { name: `Follow ${f.name}` }).click();
      await page.getByText(`You follow ${f.name}: a weekly digest, to ${reader.email}.`).waitFor();
      await shoot(page, '6-following');
      const sub = await Subscription.findOne({ where: { feedstockId: f.id, email: reader.email! } });
      expect(sub).toMatchObject({ mode: 'digest', userId: reader.id });
      expect(sub!.confirmedAt).toBeInstanceOf(Date);

      await page.goto(`${app.url}/account`);
      await hydrated(page);
      const section = page.getByRole('region', { name: 'Subscriptions' });
      await section.getByRole('link', { name: f.name }).waitFor();
      expect(await section.textContent()).toContain('A weekly digest');
      await shoot(page, '7-account');
      await section.getByRole('button', { name: `${f.name}: switch to each update as it happens` }).click();
      await section.getByText(`${f.name}: each update as it happens.`).waitFor();
      expect((await sub!.reload()).mode).toBe('immediate');
      await section.getByRole('button', { name: `Unsubscribe from ${f.name}` }).click();
      await section.getByText(`Stopped: no more mail about ${f.name}.`).waitFor();
      expect((await sub!.reload()).unsubscribedAt).toBeInstanceOf(Date);
      await context.close();
    } finally {
      await Subscription.destroy({ where: { userId: reader.id } });
      await User.destroy({ where: { id: reader.id } });
    }
  });
});
