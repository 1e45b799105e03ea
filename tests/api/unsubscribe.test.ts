import type { Transporter } from 'nodemailer';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, OutboxMessage, Subscription, User } from '@/db/models';
import { getEnv } from '@/lib/env';
import { drainOutbox } from '@/lib/mail/outbox-worker';
import { runWeeklyDigest } from '@/lib/services/digests';
import { createUnsubscribeToken, listUnsubscribeHeaders } from '@/lib/mail/unsubscribe-token';
import { createProposal } from '@/lib/services/proposals';
import { buildFeedstock, buildUser } from '../support/factories';
import { startNextHandler } from '../support/next-app';
import { actorOf, buildSubscription, captureTransport, cleanUpMailFixtures, headerValues, mailsTo, startTestCapture, testEmail } from '../support/mail';

const DAY = 86_400_000;

// RFC 8058 one-click unsubscribe through the real Next.js handler (supertest):
// the POST a mail client sends, the GET a person's browser sends, and forgeries.
describe('one-click unsubscribe (RFC 8058)', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let capture: Awaited<ReturnType<typeof startTestCapture>>;
  let transport: Transporter;
  let author: User;
  const feedstocks: Feedstock[] = [];
  const subscriptions: Subscription[] = [];

  const worker = () => ({ transport, log: () => {} });
  const open = async (f: Feedstock) =>
    createProposal(actorOf(author), {
      feedstockId: f.id,
      settings: [{ setting: 'bin', verdict: 'limit', ceilingKgM2: 2, cautions: [] }],
      rationale: 'Three bin trials at 2 kg/m² were eaten within three weeks.',
    });
  /** The path and query of the List-Unsubscribe URL of the newest mail to `email`. */
  const unsubscribePathOf = (email: string) => {
    const mails = mailsTo(capture.dir, email);
    const header = headerValues(mails[mails.length - 1], 'List-Unsubscribe')[0];
    const url = new URL(header.match(/^<([^>]+)>/)![1]);
    return `${url.pathname}${url.search}`;
  };

  beforeAll(async () => {
    capture = await startTestCapture();
    transport = captureTransport(capture.port);
    author = await buildUser({ role: 'contributor', createdAt: new Date(Date.now() - 30 * DAY) });
    app = await startNextHandler();
    await drainOutbox(worker());
  });

  afterAll(async () => {
    await app?.close();
    transport?.close();
    await capture?.cleanup();
    await cleanUpMailFixtures({ feedstocks, subscriptions });
    await User.destroy({ where: { id: author.id } });
    await sequelize.close();
  });

  it('a POST with List-Unsubscribe=One-Click answers 2xx without a redirect and stops further mail', async () => {
    const f = await buildFeedstock();
    feedstocks.push(f);
    const s = await buildSubscription(f, { email: testEmail('one-click') });
    subscriptions.push(s);
    await open(f);
    await drainOutbox(worker());
    expect(mailsTo(capture.dir, s.email)).toHaveLength(1);
    const path = unsubscribePathOf(s.email);

    // A mail client's request: no cookies, no Origin of ours (RFC 8058 §3.2, Google's example: form-encoded, 26 bytes).
    const res = await request(app.server)
      .post(path)
      .set('Content-Type', 'application/x-www-form-urlencoded')
      .set('Origin', 'https://mail.example.net')
      .set('Sec-Fetch-Site', 'cross-site')
      .send('List-Unsubscribe=One-Click');
    expect(res.status).toBeGreaterThanOrEqual(200);
    expect(res.status).toBeLessThan(300);
    // RFC 8058 §3.2: the sender MUST NOT return an HTTPS redirect.
    expect(res.headers.location).toBeUndefined();
    expect(res.body).toMatchObject({ unsubscribed: true, alreadyUnsubscribed: false });
    await s.reload();
    expect(s.unsubscribedAt).toBeInstanceOf(Date);

    // Further events queue nothing for this reader, and nothing more arrives.
    await open(f);
    expect(await OutboxMessage.count({ where: { recipient: s.email, status: ['pending', 'digest'] } })).toBe(0);
    await drainOutbox(worker());
    expect(mailsTo(capture.dir, s.email)).toHaveLength(1);

    // A second POST (mail clients retry) is still a 2xx.
    const again = await request(app.server).post(path).type('form').send({ 'List-Unsubscribe': 'One-Click' });
    expect(again.status).toBe(200);
    expect(again.body.alreadyUnsubscribed).toBe(true);
  });

  it('cancels mail already queued for the reader when they unsubscribe', async () => {
    const f = await buildFeedstock();
    feedstocks.push(f);
    const s = await buildSubscription(f, { email: testEmail('queued') });
    subscriptions.push(s);
    await open(f);
    const token = createUnsubscribeToken(getEnv().AUTH_SECRET, { scope: 's', id: s.id, email: s.email });
    const res = await request(app.server).post(`/api/unsubscribe?token=${token}`).type('form').send('List-Unsubscribe=One-Click');
    expect(res.status).toBe(200);
    const row = await OutboxMessage.findOne({ where: { recipient: s.email } });
    expect(row!.status).toBe('cancelled');
    await drainOutbox(worker());
    expect(mailsTo(capture.dir, s.email)).toEqual([]);
  });

  it('the one-click link of a weekly digest stops every digest subscription of that address, and nothing else', async () => {
    const f = await buildFeedstock();
    const g = await buildFeedstock();
    const h = await buildFeedstock();
    feedstocks.push(f, g, h);
    const email = testEmail('digest-reader');
    const weeklyF = await buildSubscription(f, { email, mode: 'digest' });
    const weeklyG = await buildSubscription(g, { email, mode: 'digest' });
    const instantH = await buildSubscription(h, { email, mode: 'immediate' });
    subscriptions.push(weeklyF, weeklyG, instantH);
    await open(f);
    await open(g);
    await runWeeklyDigest(new Date());
    await drainOutbox(worker());
    const digest = mailsTo(capture.dir, email).find((m) => m.subject.startsWith('Your week on Trialbed'))!;
    expect(headerValues(digest, 'List-Unsubscribe')[0]).toMatch(/token=d\d+\./);
    const res = await request(app.server).post(unsubscribePathOf(email)).type('form').send('List-Unsubscribe=One-Click');
    expect(res.status).toBe(200);
    expect(res.headers.location).toBeUndefined();
    expect((await weeklyF.reload()).unsubscribedAt).toBeInstanceOf(Date);
    expect((await weeklyG.reload()).unsubscribedAt).toBeInstanceOf(Date);
    expect((await instantH.reload()).unsubscribedAt).toBeNull();
  });

  it('a GET never unsubscribes: it leads to a confirmation page with a button', async () => {
    const f = await buildFeedstock();
    feedstocks.push(f);
    const s = await buildSubscription(f, { email: testEmail('get') });
    subscriptions.push(s);
    const token = createUnsubscribeToken(getEnv().AUTH_SECRET, { scope: 's', id: s.id, email: s.email });
    const res = await request(app.server).get(`/api/unsubscribe?token=${token}`);
    expect(res.status).toBe(303);
    expect(res.headers.location).toMatch(new RegExp(`/unsubscribe\\?token=${token.replace('.', '\\.')}$`));
    const page = await request(app.server).get(`/unsubscribe?token=${token}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain(f.name);
    expect(page.text).toMatch(/<button[^>]*type="submit"[^>]*>Unsubscribe<\/button>/);
    await s.reload();
    // RFC 8058 §3.1 (mail receivers POST only with consent); a GET from a link checker changes nothing.
    expect(s.unsubscribedAt).toBeNull();
  });

  it('refuses a forged or altered token with 4xx and changes nothing', async () => {
    const f = await buildFeedstock();
    feedstocks.push(f);
    const s = await buildSubscription(f, { email: testEmail('forged') });
    subscriptions.push(s);
    const real = createUnsubscribeToken(getEnv().AUTH_SECRET, { scope: 's', id: s.id, email: s.email });
    const forgedWithOtherSecret = createUnsubscribeToken('not-the-secret', { scope: 's', id: s.id, email: s.email });
    const otherAddress = createUnsubscribeToken(getEnv().AUTH_SECRET, { scope: 's', id: s.id, email: 'someone-else@example.test' });
    const dot = real.indexOf('.');
    // Both ends of the MAC: the last character carries spare bits, and a decoded comparison would miss a change there.
    const flippedFirst = `${real.slice(0, dot + 1)}${real[dot + 1] === 'A' ? 'B' : 'A'}${real.slice(dot + 2)}`;
    const flippedLast = `${real.slice(0, -1)}${real.endsWith('A') ? 'B' : 'A'}`;
    const otherId = `s${s.id + 1}${real.slice(dot)}`;
    for (const token of [forgedWithOtherSecret, otherAddress, flippedFirst, flippedLast, otherId]) {
      const res = await request(app.server).post(`/api/unsubscribe?token=${token}`).type('form').send('List-Unsubscribe=One-Click');
      expect(res.status, token).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    for (const token of ['', 'nonsense', 's1.short']) {
      const res = await request(app.server).post(`/api/unsubscribe?token=${encodeURIComponent(token)}`).type('form').send('List-Unsubscribe=One-Click');
      expect(res.status).toBe(400);
      expect(res.body.error.fieldErrors.token).toBeDefined();
    }
    // The body must be the RFC 8058 pair.
    const wrongBody = await request(app.server).post(`/api/unsubscribe?token=${real}`).type('form').send('List-Unsubscribe=Yes');
    expect(wrongBody.status).toBe(400);
    expect(wrongBody.body.error.fieldErrors['List-Unsubscribe']).toBeDefined();
    await s.reload();
    expect(s.unsubscribedAt).toBeNull();
    const page = await request(app.server).get(`/unsubscribe?token=${forgedWithOtherSecret}`);
    expect(page.text).toContain('This unsubscribe link is not valid');
  });

  it('builds the headers to the letter of RFC 2369 and RFC 8058', () => {
    const h = listUnsubscribeHeaders('https://trialbed.example.org/', 's12.abc');
    // RFC 2369 §2: the URL in angle brackets. RFC 8058 §3.1: one HTTPS URI; the Post header holds exactly the one pair.
    expect(h['List-Unsubscribe']).toBe('<https://trialbed.example.org/api/unsubscribe?token=s12.abc>');
    expect(h['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
  });
});
