import { AxeBuilder } from '@axe-core/playwright';
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Photo, Trial } from '@/db/models';
import { freePort } from '../../db/server/mariadb.mjs';
import { startNextHandler } from '../support/next-app';

const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

// A reader on a phone browses the trials: filters in the address, a trial page with its chart,
// check-ins and photos. Headless Debian Chromium, the built app on a free loopback port.
describe('trial pages in a phone browser', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let base: string;
  let browser: Browser;

  beforeAll(async () => {
    const port = await freePort();
    app = await startNextHandler({ port });
    await new Promise<void>((r) => app.server.listen(port, '127.0.0.1', r));
    base = `http://localhost:${port}`;
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await sequelize.close();
  });

  it('filters the list through the address, opens a trial, shows its chart and loads its photos', async () => {
    const context = await browser.newContext({ viewport: { width: 375, height: 812 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    await page.goto(`${base}/trials`);
    await page.getByLabel('Setting').selectOption('bed');
    await page.getByLabel('Status').selectOption('closed');
    await page.getByRole('button', { name: 'Show' }).click();
    await page.waitForURL(/setting=bed/);
    const url = new URL(page.url());
    expect([url.searchParams.get('setting'), url.searchParams.get('status')]).toEqual(['bed', 'closed']);
    const total = await Trial.count({ where: { setting: 'bed', status: 'closed' } });
    expect(await page.getByText(`of ${total}`).count()).toBeGreaterThan(0);

    // The first card on a phone (the table is hidden below 768 px).
    const cards = page.getByRole('list', { name: /^Trials 1–/ }).getByRole('link');
    expect(await cards.count()).toBeGreaterThan(0);
    await cards.first().click();
    await page.waitForURL(/\/trials\/\d+$/);
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const trial = (await Trial.findByPk(id))!;
    expect([trial.setting, trial.status]).toEqual(['bed', 'closed']);

    const chart = page.getByRole('img', { name: /Share of the dose remaining and worm activity by day/ });
    expect(await chart.count()).toBe(1);
    await page.getByText('The chart’s numbers as a table').click();
    expect(await page.locator('figure table tbody tr').count()).toBeGreaterThan(0);

    const photos = await Photo.count({ where: { trialId: id } });
    const thumbs = page.locator('img[src*="/api/photos/"]');
    expect(await thumbs.count()).toBe(photos);
    for (const img of await thumbs.all()) {
      await img.scrollIntoViewIfNeeded();
      await expect.poll(() => img.evaluate((el) => (el as HTMLImageElement).complete && (el as HTMLImageElement).naturalWidth > 0)).toBe(true);
    }
    await context.close();
  });

  it('has no axe-detectable accessibility violations on the list and a trial page', async () => {
    const trial = (await Trial.findOne({ where: { isDemo: true, status: 'running' }, order: [['id', 'ASC']] }))!;
    for (const path of ['/trials', `/trials/${trial.id}`, '/trials/new']) {
      const context = await browser.newContext({ viewport: { width: 375, height: 812 } });
      const page = await context.newPage();
      await page.goto(`${base}${path}`);
      const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
      expect(results.violations.map((v) => `${path}: ${v.id} (${v.nodes.length})`)).toEqual([]);
      await context.close();
    }
  });
});
