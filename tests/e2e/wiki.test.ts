import { mkdirSync } from 'node:fs';
import path from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { AuditLog, Feedstock, FeedstockRevision, OutboxMessage, User } from '@/db/models';
import { SESSION_COOKIE_BASE } from '@/lib/auth/cookies';
import { startAppProcess } from '../support/app-process';
import { launchChromium, serveApp } from '../support/browser';
import { buildFeedstock, buildUser } from '../support/factories';
import { openSession } from '../support/sessions';

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
    // Results of a half-typed question may show for a moment (kept while the next answer loads): wait for the whole question's.
    await expect.poll(() => option.innerText(), { timeout: 10_000 }).toContain('Orange peel');
    expect(await input.getAttribute('aria-expanded')).toBe('true');
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

  it('never opens the previous question\'s answer: while a new question loads, Enter asks the results page', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await open(page, `${app.baseUrl}/`);
    const input = page.getByRole('combobox', { name: 'Can worms eat …?' });
    await input.fill('bread');
    const option = page.locator('#search-hero-q-list [role=option]').first();
    await expect.poll(() => option.innerText(), { timeout: 10_000 }).toContain('Bread');
    // Hold the next answer back, so the first question's results are still on screen while the second is asked.
    // Expected behaviour from WAI-ARIA 1.2 (aria-busy: the list is being updated; aria-activedescendant names the
    // option the keyboard is on) and the ARIA Authoring Practices combobox pattern (Enter accepts the focused option).
    await page.route(/\/api\/search\?q=garlic/, async (route) => {
      await new Promise((r) => setTimeout(r, 2_000));
      await route.continue().catch(() => {});
    });
    await input.fill('garlic');
    await page.keyboard.press('ArrowDown');
    expect(await input.getAttribute('aria-activedescendant')).toBeNull();
    expect(await page.locator('#search-hero-q-list').getAttribute('aria-busy')).toBe('true');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/search\?q=garlic$/);
    expect(page.url()).not.toContain('/feedstocks/bread');
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

  // A contributor suggests a page-text edit (with the live preview), an editor approves it from the review queue, the
  // history shows the diff, and the editor reverts it — signed in with real Auth.js database sessions, against
  // `next start` on http://localhost (the cookie's domain), on a feedstock this test makes for itself.
  describe('page-text edit journey (signed in)', () => {
    let journeyApp: { url: string; stop: () => Promise<void> };
    let feedstock: Feedstock;
    const users: User[] = [];
    const OLD_LINE = 'Cut the rind into thumb-sized pieces.';
    const NEW_LINE = 'Cut the rind into pieces no bigger than a walnut.';
    const OLD_TEXT = `Journey pumpkin rind softens in about a week.\n\n${OLD_LINE}\n`;
    const NEW_TEXT = `Journey pumpkin rind softens in about a week.\n\nCut the rind into pieces no bigger than a **walnut**.\n\n## Watch for\n\n- Mould on rind the worms leave\n`;

    const signedIn = async (role: User['role'], width: number): Promise<{ context: BrowserContext; page: Page }> => {
      const user = await buildUser({ role });
      users.push(user);
      const context = await browser.newContext({ viewport: { width, height: 900 } });
      const { token } = await openSession(user);
      await context.addCookies([{ name: SESSION_COOKIE_BASE, value: token, domain: 'localhost', path: '/', httpOnly: true, sameSite: 'Lax' }]);
      return { context, page: await context.newPage() };
    };

    /**
     * Waits until the page is interactive: the header's "Sign out" appears only after React has hydrated the page and
     * asked /api/account from the browser. Typing earlier races hydration, which can reset the box under the cursor.
     */
    const hydrated = (page: Page) => page.getByRole('button', { name: 'Sign out' }).waitFor();

    /** axe (no serious or critical findings) and a full-page screenshot at each width. */
    const checkAtWidths = async (page: Page, name: string) => {
      for (const width of WIDTHS) {
        await page.setViewportSize({ width, height: 900 });
        const results = await new AxeBuilder({ page }).analyze();
        const bad = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
        expect(bad.map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join(', ')}`), `${name} at ${width}`).toEqual([]);
        await page.screenshot({ path: path.join(ARTIFACTS, `${name}-${width}.png`), fullPage: true });
      }
    };

    /** The "About …" section of the public feedstock page, read by a visitor after a reload. */
    const aboutText = async (page: Page) => {
      await page.goto(`${journeyApp.url}/feedstocks/${feedstock.slug}`, { waitUntil: 'load' });
      return page.getByRole('region', { name: `About ${feedstock.name.toLowerCase()}` }).innerText();
    };
    // The page may be served from the Next.js cache: reload a few times until the write shows (a write that never shows fails).
    const POLL = { timeout: 15_000, intervals: [250, 500, 1_000, 2_000] };

    beforeAll(async () => {
      journeyApp = await startAppProcess({ TRIALBED_DEMO: '1' });
      feedstock = await buildFeedstock({ name: `Journey pumpkin rind ${Date.now()}` });
      await feedstock.update({ pageText: OLD_TEXT });
      const founder = await buildUser({ role: 'editor' });
      users.push(founder);
      // Version 1, as a created page starts (lib/services/feedstocks.ts createFeedstock).
      await FeedstockRevision.create({ feedstockId: feedstock.id, authorId: founder.id, body: OLD_TEXT, editSummary: 'First version of the page', status: 'published', baseVersion: 0, reviewerId: founder.id, reviewedAt: new Date() });
    }, 120_000);

    afterAll(async () => {
      await journeyApp?.stop();
      if (feedstock) {
        await OutboxMessage.destroy({ where: { feedstockId: feedstock.id } });
        await AuditLog.destroy({ where: { subjectType: 'feedstock', subjectId: String(feedstock.id) } });
        await feedstock.destroy(); // revisions cascade
      }
      await User.destroy({ where: { id: users.map((u) => u.id) } });
    });

    it('contributor suggests an edit with preview, an editor approves it at /review/edits, the history shows the diff and a revert', async () => {
      const visitor = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      const reader = await visitor.newPage();
      expect(await aboutText(reader)).toContain(OLD_LINE);

      // 1. A contributor opens the edit page, changes the text, checks the preview, sends it for review.
      const c = await signedIn('contributor', 1280);
      await c.page.goto(`${journeyApp.url}/feedstocks/${feedstock.slug}/edit`, { waitUntil: 'load' });
      await c.page.getByRole('heading', { level: 1, name: `Suggest an edit to the page about ${feedstock.name.toLowerCase()}` }).waitFor();
      await hydrated(c.page);
      const preview = c.page.getByRole('region', { name: 'Preview' });
      await preview.getByText(OLD_LINE).waitFor();
      await c.page.getByLabel('Page text').fill(NEW_TEXT);
      expect(await c.page.getByLabel('Page text').inputValue()).toBe(NEW_TEXT);
      // The preview renders the markdown as the page will: bold, a heading (one level below the page's h2s), a list.
      await preview.getByText(NEW_LINE).waitFor();
      expect(await preview.locator('strong').innerText()).toBe('walnut');
      await preview.getByRole('heading', { level: 3, name: 'Watch for' }).waitFor();
      expect(await preview.getByRole('listitem').innerText()).toBe('Mould on rind the worms leave');
      expect(await preview.getByText(OLD_LINE).count()).toBe(0);
      await c.page.getByLabel('What did you change?').fill('Smaller pieces; what to watch for');
      await checkAtWidths(c.page, 'edit-journey-edit');
      await c.page.setViewportSize({ width: 1280, height: 900 });
      await c.page.getByRole('button', { name: 'Send for review' }).click();
      await c.page.getByRole('status').filter({ hasText: 'your edit is waiting for an editor to review it' }).waitFor();
      expect(await c.page.getByRole('button', { name: 'Send for review' }).isDisabled()).toBe(true);
      await c.page.screenshot({ path: path.join(ARTIFACTS, 'edit-journey-sent-1280.png'), fullPage: true });
      await c.context.close();
      // The public page still shows the old text.
      const waiting = await aboutText(reader);
      expect(waiting).toContain(OLD_LINE);
      expect(waiting).not.toContain(NEW_LINE);

      // 2. An editor finds it in the review queue with its diff, and approves it.
      const e = await signedIn('editor', 1280);
      await e.page.goto(`${journeyApp.url}/review/edits`, { waitUntil: 'load' });
      await e.page.getByRole('heading', { level: 1, name: 'Suggested edits' }).waitFor();
      await hydrated(e.page);
      const item = e.page.getByRole('listitem').filter({ has: e.page.getByRole('link', { name: feedstock.name, exact: true }) });
      await item.getByText('“Smaller pieces; what to watch for”').waitFor();
      const suggested = item.getByRole('region', { name: `Suggested changes to ${feedstock.name}` });
      await suggested.locator('del', { hasText: OLD_LINE }).waitFor();
      await suggested.locator('ins', { hasText: 'Cut the rind into pieces no bigger than a **walnut**.' }).waitFor();
      await suggested.locator('ins', { hasText: '- Mould on rind the worms leave' }).waitFor();
      await checkAtWidths(e.page, 'edit-journey-review');
      await e.page.setViewportSize({ width: 1280, height: 900 });
      await item.getByLabel(/Note to the author/).fill('Thanks, clear advice.');
      await item.getByRole('button', { name: 'Approve and publish' }).click();
      // Back at the queue: it says what was published, and the edit has left the list.
      await e.page.getByRole('status').filter({ hasText: `Published the edit to ${feedstock.name} as version 2.` }).waitFor();
      expect(await item.count()).toBe(0);
      // The title streams in just after the page body on a client-side redirect: wait for it before axe reads the page.
      await expect.poll(() => e.page.title()).toBe('Suggested edits · Trialbed');
      await checkAtWidths(e.page, 'edit-journey-approved');
      await expect.poll(() => aboutText(reader), POLL).toContain(NEW_LINE);
      expect(await reader.getByRole('region', { name: `About ${feedstock.name.toLowerCase()}` }).getByRole('heading', { name: 'Watch for' }).count()).toBe(1);
      expect(await aboutText(reader)).not.toContain(OLD_LINE);

      // 3. The history shows version 2 as current with its diff; the editor reverts to version 1 from there.
      const entry = (version: number) => e.page.getByRole('listitem').filter({ has: e.page.getByRole('heading', { level: 2, name: new RegExp(`^Version ${version}\\b`) }) });
      await e.page.goto(`${journeyApp.url}/feedstocks/${feedstock.slug}/history`, { waitUntil: 'load' });
      await e.page.getByRole('heading', { level: 1, name: `History of the page about ${feedstock.name.toLowerCase()}` }).waitFor();
      expect(await e.page.getByText('2 published versions, newest first.').count()).toBe(1);
      // The badge is read with a space: "Version 2 current".
      await e.page.getByRole('heading', { level: 2, name: 'Version 2 current', exact: true }).waitFor();
      await entry(2).getByText(/“Smaller pieces; what to watch for” — .*, approved by /).waitFor();
      const v2diff = entry(2).getByRole('region', { name: 'Changes in version 2' });
      await v2diff.locator('del', { hasText: OLD_LINE }).waitFor();
      await v2diff.locator('ins', { hasText: 'no bigger than a **walnut**' }).waitFor();
      expect(await entry(2).getByRole('button', { name: /Revert/ }).count()).toBe(0); // the current version has no revert
      await hydrated(e.page);
      await checkAtWidths(e.page, 'edit-journey-history');
      await e.page.setViewportSize({ width: 1280, height: 900 });
      await entry(1).getByRole('button', { name: 'Revert to version 1' }).click();
      await entry(1).getByRole('status').filter({ hasText: 'Reverted: the old text is now version 3.' }).waitFor();
      await expect.poll(() => aboutText(reader), POLL).toContain(OLD_LINE);
      expect(await aboutText(reader)).not.toContain(NEW_LINE);
      // The history lists the revert as version 3, current, removing what version 2 added.
      await e.page.reload({ waitUntil: 'load' });
      expect(await e.page.getByText('3 published versions, newest first.').count()).toBe(1);
      await e.page.getByRole('heading', { level: 2, name: 'Version 3 current', exact: true }).waitFor();
      await entry(3).getByText(/“Reverted to version 1” — /).waitFor();
      const v3diff = entry(3).getByRole('region', { name: 'Changes in version 3' });
      await v3diff.locator('del', { hasText: 'no bigger than a **walnut**' }).waitFor();
      await v3diff.locator('ins', { hasText: OLD_LINE }).waitFor();
      expect(await entry(2).getByText('current', { exact: true }).count()).toBe(0);
      await e.page.setViewportSize({ width: 375, height: 900 });
      await e.page.screenshot({ path: path.join(ARTIFACTS, 'edit-journey-history-reverted-375.png'), fullPage: true });
      await e.context.close();
      await visitor.close();
    }, 180_000);
  });
});
