/**
 * PENDING: runs once the sign-in work has replaced lib/auth/actor.ts (it reads
 * the Auth.js database session from the `authjs.session-token` cookie). To
 * enable, move this file to tests/e2e/trial-logging.test.ts.
 *
 * A contributor on a phone-sized screen logs a trial with a photo and two
 * check-ins, and the feedstock's page shows it. Headless Debian Chromium via
 * playwright-core against the built app on a free loopback port.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { AxeBuilder } from '@axe-core/playwright';
import { chromium, type Browser, type Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../db/server/mariadb.mjs';
import { sequelize } from '@/db';
import { CheckIn, EvidenceAggregate, Feedstock, Photo, Trial, User } from '@/db/models';
import { aggregateFeedstock } from '@/lib/evidence';
import { loadTrialInputs } from '@/lib/services/evidence';
import { buildFeedstock, buildUser } from '../support/factories';
import { startNextHandler } from '../support/next-app';
import { openSession, type TestSession } from '../support/sessions';

const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];
const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
const axeViolations = async (page: Page) =>
  (await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze()).violations.map((v) => `${v.id} (${v.nodes.length})`);

describe('trial logging on a phone', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let base: string;
  let browser: Browser;
  let profile: string;
  let user: User;
  let feedstock: Feedstock;
  let session: TestSession;

  beforeAll(async () => {
    user = await buildUser({ role: 'contributor' });
    feedstock = await buildFeedstock({ name: `Bean husks ${Date.now().toString(36)}` });
    session = await openSession(user);
    const port = await freePort();
    app = await startNextHandler({ port });
    await new Promise<void>((resolve) => app.server.listen(port, '127.0.0.1', resolve));
    // Auth.js builds cookies for `localhost`; the server listens on loopback only.
    base = `http://localhost:${port}`;
    // playwright-core launches with a fresh temporary profile of its own; this directory holds downloads and traces.
    profile = mkdtempSync(path.join(os.tmpdir(), 'trialbed-chromium-'));
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS, downloadsPath: profile });
  });

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    rmSync(profile, { recursive: true, force: true });
    await Trial.destroy({ where: { feedstockId: feedstock.id } });
    await session.revoke();
    await feedstock.destroy();
    await user.destroy();
    await sequelize.close();
  });

  it('logs a trial with a photo and two check-ins, and the feedstock page shows it', async () => {
    const context = await browser.newContext({ viewport: { width: 375, height: 812 }, deviceScaleFactor: 2, hasTouch: true, isMobile: true });
    await context.addCookies([session.browserCookie(base)]);
    const page = await context.newPage();
    const photo = await sharp({ create: { width: 120, height: 90, channels: 3, background: '#5b4030' } }).jpeg().toBuffer();

    // New trial: the feedstock is picked from the combobox by typing part of its name.
    await page.goto(`${base}/trials/new`);
    expect(await axeViolations(page)).toEqual([]);
    // Sending it empty shows the shared schema's messages next to the fields, and a summary.
    await page.getByRole('button', { name: 'Log this trial' }).click();
    await page.locator('#form-errors').waitFor();
    expect(await page.getByText('Choose a feedstock.').count()).toBeGreaterThan(0);
    expect(await page.getByText('Dose must be more than zero.').count()).toBeGreaterThan(0);
    expect(await axeViolations(page)).toEqual([]);
    await page.getByRole('combobox', { name: /Feedstock/ }).fill(feedstock.name.slice(0, 10));
    await page.getByRole('option', { name: feedstock.name }).click();
    await page.getByLabel('Preparation').selectOption('chopped');
    await page.getByLabel('Where it came from').selectOption('home-grown');
    await page.getByLabel('Dose: amount').fill('1.5');
    await page.getByLabel('Dose: unit').selectOption('kg');
    await page.getByRole('radio', { name: /Enclosed bin/ }).check();
    await page.getByLabel('Surface area of the bed or bin: amount').fill('0.25');
    await page.getByLabel(/^Region/).fill('Test valley');
    await page.getByLabel(/^Start date/).fill(day(-14));
    await page.getByRole('button', { name: 'Log this trial' }).click();
    await page.waitForURL(/\/trials\/\d+$/);
    const trialId = Number(new URL(page.url()).pathname.split('/').pop());
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain(feedstock.name);
    expect(await axeViolations(page)).toEqual([]);

    // A photo of the set-up, straight from the camera input, with a progress bar.
    await page.locator('#trial-photos').setInputFiles({ name: 'IMG_0001.jpg', mimeType: 'image/jpeg', buffer: photo });
    await page.getByText('Uploaded.').waitFor();
    await page.getByRole('img', { name: /photo 1 of 1/ }).waitFor();

    // Two check-ins; the second carries a photo.
    const checkIn = async (date: string, worms: string, left: string, withPhoto: boolean) => {
      await page.getByLabel(/^Date/).fill(date);
      await page.getByRole('radio', { name: worms, exact: true }).check();
      await page.getByLabel(/^Share of the dose still there/).fill(left);
      if (withPhoto) await page.locator('#check-in-photos').setInputFiles({ name: 'IMG_0002.jpg', mimeType: 'image/jpeg', buffer: photo });
      await page.getByRole('button', { name: 'Save check-in' }).click();
      await page.getByRole('status').filter({ hasText: 'Check-in saved' }).waitFor();
    };
    await checkIn(day(-7), 'A few', '60', false);
    await page.getByRole('heading', { name: /^Day 7/ }).waitFor();
    await checkIn(day(0), 'Many', '5', true);
    await page.getByRole('heading', { name: /^Day 14/ }).waitFor();
    await page.getByText('Check-in saved with 1 of 1 photo.').waitFor();

    // The chart has a text alternative; thumbnails load from the photo route.
    await page.reload();
    await expect(page.getByRole('img', { name: /Share of the dose remaining and worm activity by day/ }).count()).resolves.toBe(1);
    const thumbsLoaded = await page.locator('img[src*="/api/photos/"]').evaluateAll((imgs) => imgs.map((i) => (i as HTMLImageElement).complete && (i as HTMLImageElement).naturalWidth > 0));
    expect(thumbsLoaded.length).toBe(2);

    // Stored as the engine computes it.
    expect(await CheckIn.count({ where: { trialId } })).toBe(2);
    expect(await Photo.count({ where: { trialId } })).toBe(2);
    const stored = await EvidenceAggregate.findAll({ where: { feedstockId: feedstock.id } });
    const engine = aggregateFeedstock(await loadTrialInputs(feedstock.id));
    expect(stored.map((g) => g.result)).toEqual(engine.groups);
    expect(engine.groups.flatMap((g) => g.trialIds)).toContain(String(trialId));

    // The feedstock page shows the trial at once.
    await page.goto(`${base}/feedstocks/${feedstock.slug}`);
    await expect(page.locator(`a[href="/trials/${trialId}"]`).count()).resolves.toBeGreaterThan(0);
    await context.close();
  });
});
