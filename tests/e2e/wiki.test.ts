import { mkdirSync } from 'node:fs';
import path from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { launchChromium, serveApp } from '../support/browser';

const ARTIFACTS = path.join(process.cwd(), 'test-artifacts');

// Pages a visitor reaches, checked with axe at a phone width and a desktop width; screenshots are kept for a human to look at.
const PAGES: Array<[name: string, path: string]> = [
  ['home', '/'],
  ['feedstock-index', '/feedstocks'],
  ['feedstock-page', '/feedstocks/orange-peel'],
  ['feedstock-manure', '/feedstocks/horse-manure'],
  ['guide', '/guides/reading-a-verdict'],
  ['edit-signed-out', '/feedstocks/orange-peel/edit'],
  ['search-no-match', '/search?q=kombucha+scoby'],
  ['tool-mix', '/tools/mix?m1=ref%3Acattle-manure&q1=10&m2=ref%3Anewspaper&q2=1&goal=cn&target=40&add=ref%3Astraw'],
];
const WIDTHS = [375, 1280];

/** Opens a page and lets client code settle (link prefetches may keep the network busy, so idle is best effort). */
async function open(page: Page, url: string) {
  const res = await page.goto(url, { waitUntil: 'load' });
  await page.waitForLoadState('networkidle', { timeout: 1_000 }).catch(() => undefined);
  return res;
}

describe('wiki pages in Chromium', () => {
  let browser: Browser;
  let app: Awaited<ReturnType<typeof serveApp>>;

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    app = await serveApp();
    browser = await launchChromium();
  });

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await sequelize.close();
  });

  it.each(PAGES)('%s has no serious or critical axe findings at 375 and 1280 px', async (name, url) => {
    for (const width of WIDTHS) {
      const context = await browser.newContext({ viewport: { width, height: 900 } });
      const page = await context.newPage();
      const res = await open(page, app.baseUrl + url);
      expect(res?.status(), `${url} at ${width}`).toBe(200);
      const results = await new AxeBuilder({ page }).analyze();
      const bad = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
      expect(bad.map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join(', ')}`), `${url} at ${width}`).toEqual([]);
      await page.screenshot({ path: path.join(ARTIFACTS, `${name}-${width}.png`), fullPage: true });
      await context.close();
    }
  }, 120_000);

  it('answers "can worms eat orange peels?" from the keyboard: type, arrow down, Enter opens the page', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await open(page, `${app.baseUrl}/`);
    const input = page.getByRole('combobox', { name: 'Can worms eat …?' });
    await input.focus();
    await page.keyboard.type('can worms eat orange peels?', { delay: 15 });
    const option = page.locator('#search-hero-q-list [role=option]').first();
    await option.waitFor();
    expect(await input.getAttribute('aria-expanded')).toBe('true');
    expect(await option.innerText()).toContain('Orange peel');
    expect(await option.innerText()).toContain('Small amounts only'); // published verdict, enclosed bin (demo scenario)
    // The open list passes axe too (combobox and listbox roles wired correctly).
    const listOpen = await new AxeBuilder({ page }).include('form[role=search]').analyze();
    expect(listOpen.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id)).toEqual([]);
    await page.screenshot({ path: path.join(ARTIFACTS, 'search-open-1280.png') });
    await page.keyboard.press('ArrowDown');
    expect(await input.getAttribute('aria-activedescendant')).toBe('search-hero-q-list-opt-0');
    expect(await option.getAttribute('aria-selected')).toBe('true');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/feedstocks\/orange-peel$/);
    expect(await page.locator('h1').innerText()).toBe('Orange peel');
    await context.close();
  }, 60_000);

  it('offers to request a feedstock nobody has, from the header search on a phone', async () => {
    const context = await browser.newContext({ viewport: { width: 375, height: 800 } });
    const page = await context.newPage();
    await open(page, `${app.baseUrl}/feedstocks`);
    await page.getByText('Menu').click();
    const input = page.locator('#search-menu-q');
    await input.fill('kombucha scoby');
    await page.locator('#search-menu-q-list [role=option]', { hasText: 'Request' }).waitFor();
    await page.keyboard.press('End');
    await page.keyboard.press('ArrowUp');
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/feedstocks\/request\?name=kombucha/);
    expect(await page.locator('#request-name').inputValue()).toBe('kombucha scoby');
    await context.close();
  }, 60_000);

  it('switches loads to lb/ft² with the units toggle and keeps the choice', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await open(page, `${app.baseUrl}/feedstocks/orange-peel`);
    await expect.poll(() => page.getByText('1.5 kg/m²').first().isVisible()).toBe(true);
    await page.getByRole('button', { name: 'lb/ft²' }).click();
    // 1.5 kg/m² = 0.307 lb/ft² (NIST SP 811 factors).
    await expect.poll(() => page.getByText('0.31 lb/ft²').first().isVisible(), { timeout: 10_000 }).toBe(true);
    expect(await page.getByRole('button', { name: 'lb/ft²' }).getAttribute('aria-pressed')).toBe('true');
    await page.reload({ waitUntil: 'load' });
    expect(await page.getByText('0.31 lb/ft²').first().isVisible()).toBe(true);
    await context.close();
  }, 60_000);

  // Pending until sign-in lands (lib/auth/actor.ts is a stand-in that returns no one): the services half of this
  // journey is tests/services/revisions.test.ts.
  it.todo('contributor suggests an edit with preview, an editor approves it at /review/edits, the history shows the diff and a revert');
});
