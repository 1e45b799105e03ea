import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, Proposal, PublishedVerdict, Trial, User } from '@/db/models';
import { SESSION_COOKIE_BASE } from '@/lib/auth/cookies';
import { createTrial } from '@/lib/services/trials';
import { CHROMIUM_ARGS, startAppProcess } from '../support/app-process';
import { buildFeedstock, buildUser } from '../support/factories';
import { openSession } from '../support/sessions';

const ARTIFACTS = path.join(process.cwd(), 'test-artifacts', 'e2e');
const DAY = 86_400_000;

// A contributor proposes, three others vote, a moderator approves, and the
// feedstock page shows the new verdict and its history — in headless Chromium
// against the built app and the real database.
describe('proposal journey (browser)', () => {
  let app: { url: string; stop: () => Promise<void> };
  let browser: Browser;
  let feedstock: Feedstock;
  const users: User[] = [];

  const person = async (role: User['role']) => {
    const u = await buildUser({ role, createdAt: new Date(Date.now() - 30 * DAY) });
    users.push(u);
    return u;
  };
  const signedInPage = async (user: User, width = 1280): Promise<{ context: BrowserContext; page: Page }> => {
    const context = await browser.newContext({ viewport: { width, height: 900 } });
    const { token } = await openSession(user);
    await context.addCookies([{ name: SESSION_COOKIE_BASE, value: token, domain: 'localhost', path: '/', httpOnly: true, sameSite: 'Lax' }]);
    return { context, page: await context.newPage() };
  };

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    app = await startAppProcess({ TRIALBED_DEMO: '1' });
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
    feedstock = await buildFeedstock({ name: `Journey squash ${Date.now()}` });
    await PublishedVerdict.create({ feedstockId: feedstock.id, setting: 'bin', verdict: 'limit', ceilingKgM2: 1, cautions: ['heating'], proposalId: null, publishedAt: new Date(Date.now() - 60 * DAY) });
    const keeper = await person('contributor');
    const actor = { id: keeper.id, role: keeper.role, emailVerified: true, createdAt: keeper.createdAt };
    for (const start of ['2026-09-01', '2026-09-08']) {
      await createTrial(actor, {
        feedstockId: feedstock.id, setting: 'bin', preparation: 'chopped', provenance: 'home-grown',
        surfaceArea: { amount: 0.3, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 0.9, unit: 'kg' },
        region: 'Journey valley', startDate: start,
      });
    }
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    await Proposal.destroy({ where: { feedstockId: feedstock.id } });
    await Trial.destroy({ where: { feedstockId: feedstock.id } });
    await feedstock?.destroy();
    await User.destroy({ where: { id: users.map((u) => u.id) } });
    await sequelize.close();
  });

  it('publishes the approved verdict and shows it with its history', async () => {
    // 1. A contributor proposes from the feedstock's propose page.
    const author = await person('contributor');
    const a = await signedInPage(author, 375);
    await a.page.goto(`${app.url}/feedstocks/${feedstock.slug}/propose`);
    await a.page.getByLabel('Propose a verdict for enclosed bin').check();
    await a.page.getByLabel(/^Verdict/).selectOption('feed');
    await a.page.getByLabel(/Dose ceiling/).fill('3');
    await a.page.getByLabel('Rationale').fill('Both chopped bin trials at 3 kg/m² were eaten within two weeks with no heating.');
    await a.page.screenshot({ path: path.join(ARTIFACTS, 'propose-375.png'), fullPage: true });
    await a.page.getByRole('button', { name: 'Open the proposal' }).click();
    await a.page.waitForURL(/\/proposals\/\d+$/);
    const proposalUrl = a.page.url();
    await a.page.getByText('You wrote this proposal, so you cannot vote on it.').waitFor();
    await a.context.close();

    // 2. Three other contributors vote; each sees the tally change without a reload.
    for (let i = 0; i < 3; i += 1) {
      const voter = await person('contributor');
      const v = await signedInPage(voter);
      await v.page.goto(proposalUrl);
      await v.page.getByLabel(/Your reason/).fill(`Agrees with trial notes (voter ${i + 1}).`);
      await v.page.getByRole('button', { name: 'Agree', exact: true }).click();
      await v.page.getByText(`${i + 1} agree`, { exact: false }).waitFor();
      if (i === 2) {
        await v.page.getByText('Ready for a moderator').waitFor();
        await v.page.screenshot({ path: path.join(ARTIFACTS, 'proposal-ready-1280.png'), fullPage: true });
      }
      await v.context.close();
    }

    // 3. A moderator approves with a note.
    const moderator = await person('moderator');
    const m = await signedInPage(moderator);
    await m.page.goto(proposalUrl);
    await m.page.getByLabel('Note for the author and the history').fill('Two consistent trials and three agreeing votes.');
    await m.page.getByRole('button', { name: 'Approve and publish' }).click();
    // The page refreshes itself after the decision: the status reads approved.
    await m.page.getByText(/Status:\s*approved/).waitFor();

    // 4. The feedstock page shows the new published verdict and its history.
    await m.page.goto(`${app.url}/feedstocks/${feedstock.slug}`);
    const history = m.page.locator('#verdict-history');
    await history.getByText('Two consistent trials and three agreeing votes.').waitFor();
    expect(await history.getByText(/Feed freely/).count()).toBeGreaterThan(0);
    // The history names the verdict it replaced.
    expect(await history.getByText(/Small amounts only/).count()).toBeGreaterThan(0);
    await m.page.screenshot({ path: path.join(ARTIFACTS, 'feedstock-after-approval-1280.png'), fullPage: true });
    const published = await PublishedVerdict.findOne({ where: { feedstockId: feedstock.id, setting: 'bin' } });
    expect(published!.verdict).toBe('feed');
    expect(published!.ceilingKgM2).toBe(3);
    await m.context.close();
  }, 180_000);
});
