import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, OutboxMessage, RateLimit, Subscription, User } from '@/db/models';
import { firstLink } from '@/lib/mail/mailbox';
import { createProposal } from '@/lib/services/proposals';
import { buildFeedstock, buildUser } from '../support/factories';
import { actorOf, cleanUpMailFixtures, mailsTo, startTestCapture, testEmail } from '../support/mail';
import { startNextHandler } from '../support/next-app';
import { callServerAction, loadBuiltActions, type BuiltAction } from '../support/server-actions';
import { openSession } from '../support/sessions';

const DAY = 86_400_000;
type State = { ok: boolean; code?: string; status?: string; message?: string; fieldErrors?: Record<string, string[]> };

// Following feedstocks through the real app: the server actions the subscribe
// panel and the account page use, called over HTTP as the browser does, with
// the confirmation mail caught by a capture SMTP server on a free port.
describe('subscriptions: double opt-in, one click, account controls', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let capture: Awaited<ReturnType<typeof startTestCapture>>;
  let actions: Map<string, BuiltAction>;
  let author: User;
  const users: User[] = [];
  const feedstocks: Feedstock[] = [];

  const act = async (name: string, fields: Record<string, string>, cookie?: string) => {
    const built = actions.get(`app/subscriptions/actions.ts#${name}`);
    expect(built, name).toBeDefined();
    const call = await callServerAction(app.baseUrl!, built!, fields, { cookie });
    expect(call.status).toBeLessThan(500);
    return call.result as State;
  };
  const newFeedstock = async () => {
    const f = await buildFeedstock();
    feedstocks.push(f);
    return f;
  };
  const newUser = async (role: User['role'] = 'reader') => {
    const u = await buildUser({ role, createdAt: new Date(Date.now() - 30 * DAY) });
    users.push(u);
    return u;
  };
  const open = (f: Feedstock) =>
    createProposal(actorOf(author), { feedstockId: f.id, settings: [{ setting: 'bin', verdict: 'feed', ceilingKgM2: 3, cautions: [] }], rationale: 'Four consumed bin trials at 3 kg/m².' });
  const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

  beforeAll(async () => {
    capture = await startTestCapture();
    process.env.SMTP_HOST = '127.0.0.1';
    process.env.SMTP_PORT = String(capture.port);
    await RateLimit.destroy({ where: {} });
    app = await startNextHandler({ listen: true });
    actions = loadBuiltActions();
    author = await newUser('contributor');
  });

  afterAll(async () => {
    await app?.close();
    await capture?.cleanup();
    await cleanUpMailFixtures({ feedstocks });
    await Subscription.destroy({ where: { userId: users.map((u) => u.id) } });
    await User.destroy({ where: { id: users.map((u) => u.id) } });
    await sequelize.close();
  });

  it('a visitor follows by e-mail: nothing counts until the mailed link is confirmed; only a hash of its token is stored', async () => {
    const f = await newFeedstock();
    const email = testEmail('visitor');
    const arrived = capture.server().nextMail(email);
    const r = await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'immediate', email: email.toUpperCase() });
    expect(r).toMatchObject({ ok: true, status: 'confirmation-sent' });
    const mail = await arrived;
    expect(mail.subject).toBe(`Confirm: follow ${f.name} on Trialbed`);
    const link = new URL(firstLink(mail.text)!);
    expect(link.pathname).toBe('/subscriptions/confirm');
    const token = link.searchParams.get('token')!;

    const row = await Subscription.findOne({ where: { feedstockId: f.id, email } });
    expect(row!.confirmedAt).toBeNull();
    expect(row!.confirmTokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    // The token itself is nowhere in the database.
    const [hit] = await sequelize.query<{ n: number }>(
      `SELECT (SELECT COUNT(*) FROM subscriptions WHERE confirm_token_hash = :token)
            + (SELECT COUNT(*) FROM outbox WHERE CAST(payload AS CHAR) LIKE :like)
            + (SELECT COUNT(*) FROM audit_log WHERE CAST(details AS CHAR) LIKE :like) AS n`,
      { replacements: { token, like: `%${token}%` }, type: QueryTypes.SELECT },
    );
    expect(Number(hit.n)).toBe(0);

    // An event before confirming queues nothing for the visitor.
    await open(f);
    expect(await OutboxMessage.count({ where: { recipient: email } })).toBe(0);

    // The page the link opens shows what is confirmed, and changes nothing by itself.
    const page = await request(app.server).get(`/subscriptions/confirm?token=${token}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain(`Confirm: follow ${f.name}`);
    expect((await row!.reload()).confirmedAt).toBeNull();

    expect(await act('confirmSubscriptionFromLink', { token })).toMatchObject({ ok: true });
    await row!.reload();
    expect(row!.confirmedAt).toBeInstanceOf(Date);
    expect(row!.confirmTokenHash).toBeNull();
    await open(f);
    expect(await OutboxMessage.count({ where: { recipient: email, status: 'pending' } })).toBe(1);

    // The link works once.
    expect(await act('confirmSubscriptionFromLink', { token })).toMatchObject({ ok: false, code: 'not_found' });
  });

  it('refuses an expired confirmation link', async () => {
    const f = await newFeedstock();
    const email = testEmail('late');
    const arrived = capture.server().nextMail(email);
    await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'digest', email });
    const token = new URL(firstLink((await arrived).text)!).searchParams.get('token')!;
    await Subscription.update({ confirmSentAt: new Date(Date.now() - 73 * 3_600_000) }, { where: { feedstockId: f.id, email } });
    expect(await act('confirmSubscriptionFromLink', { token })).toMatchObject({ ok: false, code: 'not_found' });
    expect((await request(app.server).get(`/subscriptions/confirm?token=${token}`)).text).toContain('does not work any more');
  });

  it('tells a stranger nothing about an address that already follows, and sends it no mail', async () => {
    const f = await newFeedstock();
    const reader = await newUser();
    const existing = await Subscription.create({ feedstockId: f.id, email: reader.email!, userId: reader.id, mode: 'digest', confirmedAt: new Date() });
    const r = await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'immediate', email: reader.email! });
    expect(r).toMatchObject({ ok: true, status: 'confirmation-sent' });
    await sleep(300);
    expect(mailsTo(capture.dir, reader.email!)).toEqual([]);
    expect((await existing.reload()).mode).toBe('digest');
  });

  it('a signed-in reader follows in one click, sees it on the account page, switches to the digest and unsubscribes', async () => {
    const f = await newFeedstock();
    const reader = await newUser();
    const { cookie } = await openSession(reader);
    const r = await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'immediate' }, cookie);
    expect(r).toMatchObject({ ok: true, status: 'following' });
    const sub = await Subscription.findOne({ where: { feedstockId: f.id, email: reader.email! } });
    expect(sub!.confirmedAt).toBeInstanceOf(Date);
    expect(sub!.userId).toBe(reader.id);
    await sleep(200);
    expect(mailsTo(capture.dir, reader.email!)).toEqual([]); // no confirmation mail needed

    const mine = await request(app.server).get('/api/subscriptions').set('Cookie', cookie);
    expect(mine.body).toMatchObject({ signedIn: true, oneClick: true, email: reader.email, subscriptions: [{ id: sub!.id, name: f.name, mode: 'immediate', confirmed: true }] });
    const account = await request(app.server).get('/account').set('Cookie', cookie);
    expect(account.text).toContain(f.name);
    expect(account.text).toContain('Each update as it happens');
    expect(account.text).not.toContain('Subscriptions come in a later version');

    expect(await act('setSubscriptionMode', { subscriptionId: String(sub!.id), mode: 'digest' }, cookie)).toMatchObject({ ok: true });
    expect((await sub!.reload()).mode).toBe('digest');
    await open(f);
    expect(await OutboxMessage.count({ where: { subscriptionId: sub!.id, status: 'digest' } })).toBe(1);

    expect(await act('stopSubscription', { subscriptionId: String(sub!.id) }, cookie)).toMatchObject({ ok: true });
    expect((await sub!.reload()).unsubscribedAt).toBeInstanceOf(Date);
    // What waited for the digest is cancelled too.
    expect(await OutboxMessage.count({ where: { subscriptionId: sub!.id, status: 'cancelled' } })).toBe(1);
    expect((await request(app.server).get('/api/subscriptions').set('Cookie', cookie)).body.subscriptions).toEqual([]);
  });

  it('lets nobody change or stop someone else’s subscription', async () => {
    const f = await newFeedstock();
    const owner = await newUser();
    const other = await newUser('admin');
    const sub = await Subscription.create({ feedstockId: f.id, email: owner.email!, userId: owner.id, mode: 'immediate', confirmedAt: new Date() });
    const { cookie } = await openSession(other);
    expect(await act('setSubscriptionMode', { subscriptionId: String(sub.id), mode: 'digest' }, cookie)).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await act('stopSubscription', { subscriptionId: String(sub.id) }, cookie)).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await act('stopSubscription', { subscriptionId: String(sub.id) })).toMatchObject({ ok: false, code: 'unauthenticated' });
    await sub.reload();
    expect(sub.mode).toBe('immediate');
    expect(sub.unsubscribedAt).toBeNull();
  });

  it('answers bad input with field messages and stores nothing', async () => {
    const f = await newFeedstock();
    const before = await Subscription.count();
    expect(await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'immediate', email: 'not-an-address' })).toMatchObject({ ok: false, code: 'invalid_input', fieldErrors: { email: [expect.any(String)] } });
    expect(await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'immediate', email: '' })).toMatchObject({ ok: false, code: 'invalid_input', fieldErrors: { email: ['Enter your e-mail address.'] } });
    expect(await act('subscribeToUpdates', { feedstockId: 'abc', mode: 'immediate', email: testEmail('x') })).toMatchObject({ ok: false, code: 'invalid_input', fieldErrors: { feedstockId: [expect.any(String)] } });
    expect(await act('subscribeToUpdates', { feedstockId: '999999999', mode: 'immediate', email: testEmail('x') })).toMatchObject({ ok: false, fieldErrors: { feedstockId: ['No such feedstock.'] } });
    expect(await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'hourly', email: testEmail('x') })).toMatchObject({ ok: false, fieldErrors: { mode: [expect.any(String)] } });
    expect(await act('setSubscriptionMode', { subscriptionId: 'x', mode: 'digest' }, (await openSession(await newUser())).cookie)).toMatchObject({ ok: false, code: 'invalid_input' });
    expect(await Subscription.count()).toBe(before);
  });

  it('limits confirmation mail per address', async () => {
    const f = await newFeedstock();
    const email = testEmail('flood');
    const results = [];
    for (let i = 0; i < 6; i++) results.push(await act('subscribeToUpdates', { feedstockId: String(f.id), mode: 'immediate', email }));
    expect(results.slice(0, 5).every((r) => r.ok)).toBe(true);
    expect(results[5]).toMatchObject({ ok: false, code: 'rate_limited' });
  });

  it('follows the whole site once however often the button is pressed', async () => {
    const reader = await newUser();
    const { cookie } = await openSession(reader);
    const results = await Promise.all(Array.from({ length: 4 }, () => act('subscribeToUpdates', { feedstockId: '', mode: 'digest' }, cookie)));
    expect(results.every((r) => r.ok)).toBe(true);
    const rows = await Subscription.findAll({ where: { feedstockId: null, email: reader.email! } });
    expect(rows).toHaveLength(1);
    expect(rows[0].mode).toBe('digest');
    await Subscription.destroy({ where: { id: rows[0].id } });
  });

  it('tells visitors they have no subscriptions', async () => {
    const res = await request(app.server).get('/api/subscriptions');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ signedIn: false, email: null, oneClick: false, subscriptions: [] });
  });
});
