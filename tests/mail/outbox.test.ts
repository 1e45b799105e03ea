import type { Transporter } from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, OutboxMessage, PublishedVerdict, Subscription, User, VerdictHistory } from '@/db/models';
import { drainOutbox, processOutboxBatch } from '@/lib/mail/outbox-worker';
import { DIGEST_CLOCK_KEY, runScheduledDigest, runWeeklyDigest } from '@/lib/services/digests';
import { purgeUnconfirmedSubscriptions } from '@/lib/services/subscriptions';
import { createProposal, decideProposal } from '@/lib/services/proposals';
import { reviewPageEdit, submitPageEdit } from '@/lib/services/revisions';
import { createTrial } from '@/lib/services/trials';
import { buildFeedstock, buildUser, trialInput } from '../support/factories';
import {
  actorOf,
  buildSubscription,
  buildTrial,
  captureTransport,
  cleanUpMailFixtures,
  headerValues,
  mailsTo,
  startTestCapture,
  testEmail,
} from '../support/mail';

const BASE = 'https://trialbed.example.org';
const DAY = 86_400_000;

// The outbox end to end on the real MariaDB: services write rows in their
// transaction, the worker sends them over real SMTP to the capture server
// (decoded there by mailparser), and we count what arrived per recipient.
describe('update mail through the outbox', () => {
  let capture: Awaited<ReturnType<typeof startTestCapture>>;
  let transport: Transporter;
  const feedstocks: Feedstock[] = [];
  const subscriptions: Subscription[] = [];
  const users: User[] = [];
  let author: User;
  let moderator: User;

  const worker = (extra: Parameters<typeof processOutboxBatch>[0] = {}) => ({ transport, baseUrl: BASE, log: () => {}, ...extra });
  const newFeedstock = async (name?: string) => {
    const f = await buildFeedstock(name ? { name } : {});
    feedstocks.push(f);
    // The published verdict the proposals will change: Keep out in open beds.
    await PublishedVerdict.create({ feedstockId: f.id, setting: 'bed', verdict: 'avoid', ceilingKgM2: null, cautions: ['heating'], proposalId: null, publishedAt: new Date() });
    return f;
  };
  const follow = async (...args: Parameters<typeof buildSubscription>) => {
    const s = await buildSubscription(...args);
    subscriptions.push(s);
    return s;
  };
  const proposeLimit = async (f: Feedstock, trialIds: number[] = []) =>
    createProposal(actorOf(author), {
      feedstockId: f.id,
      settings: [{ setting: 'bed', verdict: 'limit', ceilingKgM2: 4, cautions: ['heating'] }],
      rationale: 'Five open-bed trials at 2 to 4 kg/m² were eaten within four weeks.',
      trialIds,
    });

  beforeAll(async () => {
    capture = await startTestCapture();
    transport = captureTransport(capture.port);
    author = await buildUser({ role: 'contributor', createdAt: new Date(Date.now() - 30 * DAY) });
    moderator = await buildUser({ role: 'moderator', createdAt: new Date(Date.now() - 30 * DAY) });
    users.push(author, moderator);
    // Rows other files left due would otherwise be mixed into our counts' timing; send them first.
    await drainOutbox(worker());
  });

  afterAll(async () => {
    transport?.close();
    await capture?.cleanup();
    await cleanUpMailFixtures({ feedstocks, subscriptions });
    await sequelize.query('DELETE FROM audit_log WHERE actor_id IN (:ids)', { replacements: { ids: users.map((u) => u.id) } });
    await User.destroy({ where: { id: users.map((u) => u.id) } });
    await sequelize.close();
  });

  it('approving a proposal mails each immediate subscriber exactly once, with the page link and both unsubscribe headers', async () => {
    const f = await newFeedstock('Orange peel test');
    const other = await newFeedstock();
    const cited = await Promise.all(Array.from({ length: 5 }, () => buildTrial(f, author)));
    const a = await follow(f, { email: testEmail('a') });
    const b = await follow(f, { email: testEmail('b') });
    const unconfirmed = await follow(f, { email: testEmail('unconfirmed'), confirmed: false });
    const stopped = await follow(f, { email: testEmail('stopped'), unsubscribed: true });
    const elsewhere = await follow(other, { email: testEmail('elsewhere') });

    const { id } = await proposeLimit(f, cited.map((t) => t.id));
    await drainOutbox(worker());
    await decideProposal(actorOf(moderator), id, { decision: 'approve', note: 'Trials 1–5 agree; heating only above 4 kg/m².' });
    const run = await drainOutbox(worker());
    expect(run.failed).toBe(0);

    for (const s of [a, b]) {
      const mails = mailsTo(capture.dir, s.email);
      // One for the proposal opening, one for the decision: exactly one each.
      expect(mails.map((m) => m.subject)).toEqual([`${f.name}: verdict proposal opened`, `${f.name}: new verdict published`]);
      const decided = mails[1];
      // PRODUCT.md: every mail says what changed and why.
      expect(decided.text).toContain(`What changed: Keep out → Small amounts only in open beds, after proposal ${id} citing 5 trials.`);
      expect(decided.text).toContain('Trials 1–5 agree; heating only above 4 kg/m².');
      expect(decided.text).toContain(`${BASE}/feedstocks/${f.slug}`);
      expect(decided.text).toContain(`${BASE}/proposals/${id}`);
      expect(decided.text).toContain(`You get this because you follow ${f.name} on Trialbed`);
      expect(decided.html).toContain(`href="${BASE}/feedstocks/${f.slug}"`);
      // RFC 8058 §3.1: exactly one List-Unsubscribe and one List-Unsubscribe-Post header.
      const lu = headerValues(decided, 'List-Unsubscribe');
      const lup = headerValues(decided, 'List-Unsubscribe-Post');
      expect(lu).toHaveLength(1);
      expect(lup).toHaveLength(1);
      // RFC 8058 §3.1: List-Unsubscribe-Post contains exactly the pair List-Unsubscribe=One-Click (case-sensitive).
      expect(lup[0]).toBe('List-Unsubscribe=One-Click');
      // RFC 2369 §2: URLs in angle brackets; RFC 8058 §3.1: it MUST contain one HTTPS URI.
      expect(lu[0]).toMatch(/^<https:\/\/trialbed\.example\.org\/api\/unsubscribe\?token=s\d+\.[A-Za-z0-9_-]{43}>$/);
      // The stable Message-ID comes from the outbox row, so a repeat delivery is recognisable.
      const row = await OutboxMessage.findOne({ where: { recipient: s.email, kind: 'verdict-decided' } });
      expect(decided.messageId).toBe(`<outbox-${row!.id}@trialbed.example.org>`);
      expect(row!.status).toBe('sent');
      expect(row!.sentAt).toBeInstanceOf(Date);
    }
    for (const s of [unconfirmed, stopped, elsewhere]) expect(mailsTo(capture.dir, s.email)).toEqual([]);
    // The history keeps the verdict the decision replaced (read before the published row changed).
    expect((await VerdictHistory.findOne({ where: { proposalId: id } }))!.previousVerdict).toBe('avoid');
  });

  it('sends one weekly digest per digest reader covering the week, then nothing more', async () => {
    const f = await newFeedstock('Coffee grounds test');
    const g = await newFeedstock('Cardboard test');
    const weekly = await follow(f, { email: testEmail('weekly'), mode: 'digest' });
    // The same reader follows a second feedstock: still one digest.
    await follow(g, { email: weekly.email, mode: 'digest' });
    const other = await follow(f, { email: testEmail('weekly-2'), mode: 'digest' });
    const instant = await follow(f, { email: testEmail('instant') });

    const p1 = await proposeLimit(f);
    await decideProposal(actorOf(moderator), p1.id, { decision: 'approve', note: 'Agreed by the trials.' });
    const p2 = await proposeLimit(g);
    await drainOutbox(worker());
    expect(mailsTo(capture.dir, weekly.email)).toEqual([]); // nothing until the digest
    expect(mailsTo(capture.dir, instant.email)).toHaveLength(2);
    expect(await OutboxMessage.count({ where: { recipient: weekly.email, status: 'digest' } })).toBe(3);

    const run = await runWeeklyDigest(new Date());
    expect(run.digests).toBeGreaterThanOrEqual(2);
    await drainOutbox(worker());

    const [digest, ...more] = mailsTo(capture.dir, weekly.email);
    expect(more).toEqual([]);
    expect(digest.subject).toBe(`Your week on Trialbed: 3 updates about ${f.name} and ${g.name}`);
    expect(digest.text).toContain(`Proposal ${p1.id} suggests: Small amounts only in open beds.`);
    expect(digest.text).toContain(`What changed: Keep out → Small amounts only in open beds, after proposal ${p1.id}.`);
    expect(digest.text).toContain(`Proposal ${p2.id} suggests`);
    expect(digest.text).toContain(`${BASE}/feedstocks/${f.slug}`);
    expect(digest.text).toContain(`You get this weekly digest because you follow ${f.name} and ${g.name} on Trialbed.`);
    expect(headerValues(digest, 'List-Unsubscribe-Post')).toEqual(['List-Unsubscribe=One-Click']);
    expect(headerValues(digest, 'List-Unsubscribe')[0]).toMatch(/^<https:\/\/trialbed\.example\.org\/api\/unsubscribe\?token=d\d+\./);
    expect(mailsTo(capture.dir, other.email)).toHaveLength(1);

    // The grouped rows point at the digest that carried them; a second run finds nothing of theirs.
    const folded = await OutboxMessage.findAll({ where: { recipient: weekly.email, kind: ['proposal-opened', 'verdict-decided'] } });
    expect(folded.map((r) => r.status)).toEqual(['digested', 'digested', 'digested']);
    expect(new Set(folded.map((r) => r.digestId)).size).toBe(1);
    await runWeeklyDigest(new Date());
    await drainOutbox(worker());
    expect(mailsTo(capture.dir, weekly.email)).toHaveLength(1);
  });

  it('loses and duplicates nothing while the mail server is down: rows back off, and all arrive once it is back', async () => {
    const f = await newFeedstock('Melon rind test');
    const readers = [await follow(f, { email: testEmail('down-1') }), await follow(f, { email: testEmail('down-2') }), await follow(null, { email: testEmail('down-site') })];
    await capture.stop();

    // Events while the server is down: a proposal, its decision, a second proposal.
    const p1 = await proposeLimit(f);
    await decideProposal(actorOf(moderator), p1.id, { decision: 'approve', note: 'Fine in open beds.' });
    await proposeLimit(f);
    const ours = () => OutboxMessage.findAll({ where: { recipient: readers.map((r) => r.email) }, order: [['id', 'ASC']] });
    expect(await ours()).toHaveLength(9);

    // The worker runs against the stopped server: every attempt fails, rows stay pending with growing delays.
    const fast = worker({ retryBaseMs: 200 });
    const first = await processOutboxBatch({ ...fast, batchSize: 100 });
    expect(first.sent).toBe(0);
    let rows = await ours();
    for (const r of rows) {
      expect(r.status).toBe('pending');
      expect(r.attempts).toBe(1);
      expect(r.lastError).toMatch(/ECONNREFUSED|ECONNECTION|connect/i);
      expect(r.nextAttemptAt.getTime()).toBeGreaterThan(Date.now() - 1_000);
    }
    await new Promise((r) => setTimeout(r, 250));
    await processOutboxBatch({ ...fast, batchSize: 100 });
    rows = await ours();
    expect(rows.every((r) => r.status === 'pending' && r.attempts === 2)).toBe(true);
    // Backoff doubles: the second wait is at least twice the first base delay (200 ms × 2^1).
    for (const r of rows) expect(r.nextAttemptAt.getTime() - r.updatedAt.getTime()).toBeGreaterThanOrEqual(400 - 5);
    expect(readers.flatMap((r) => mailsTo(capture.dir, r.email))).toEqual([]);

    // The server comes back on the same port; the worker runs until idle.
    await capture.restart();
    const done = await drainOutbox({ ...fast, waitForRetries: true, timeoutMs: 20_000 });
    expect(done.failed).toBe(0);

    for (const r of readers) {
      const mails = mailsTo(capture.dir, r.email);
      expect(mails).toHaveLength(3); // opened, decided, opened — none lost
      expect(new Set(mails.map((m) => m.messageId)).size).toBe(3); // none duplicated
    }
    rows = await ours();
    expect(rows.every((r) => r.status === 'sent' && r.attempts >= 3 && r.sentAt)).toBe(true);
    await readers[2].update({ unsubscribedAt: new Date() }); // the whole-site reader would hear of later tests' events
  });

  it('re-sends a mail whose worker died after the server accepted it with the same Message-ID, and marks it sent once', async () => {
    const f = await newFeedstock();
    const s = await follow(f, { email: testEmail('crash') });
    await proposeLimit(f);
    const crash = worker({
      lockMs: 400,
      afterSend: async () => {
        throw new Error('simulated crash between "250 OK" and the sent mark');
      },
    });
    await expect(processOutboxBatch(crash)).rejects.toThrow(/simulated crash/);
    const row = await OutboxMessage.findOne({ where: { recipient: s.email } });
    expect(row!.status).toBe('sending');

    // While the dead worker's lock holds, nobody takes the row.
    await processOutboxBatch(worker());
    expect(mailsTo(capture.dir, s.email)).toHaveLength(1);
    // When it runs out, the row is sent again — with the same Message-ID — and marked sent.
    await new Promise((r) => setTimeout(r, 450));
    await drainOutbox(worker());
    const mails = mailsTo(capture.dir, s.email);
    expect(mails).toHaveLength(2);
    expect(new Set(mails.map((m) => m.messageId))).toEqual(new Set([`<outbox-${row!.id}@trialbed.example.org>`]));
    await row!.reload();
    expect(row!.status).toBe('sent');
    expect(row!.attempts).toBe(2);
  });

  it('lets two workers drain at once without sending any row twice (SKIP LOCKED claims)', async () => {
    const f = await newFeedstock();
    const readers = await Promise.all(Array.from({ length: 6 }, (_, i) => follow(f, { email: testEmail(`pair-${i}`) })));
    for (let i = 0; i < 5; i++) await proposeLimit(f);
    const [w1, w2] = await Promise.all([drainOutbox(worker({ batchSize: 3 })), drainOutbox(worker({ batchSize: 3 }))]);
    expect(w1.sent + w2.sent).toBeGreaterThanOrEqual(30);
    expect(w1.sent).toBeGreaterThan(0);
    expect(w2.sent).toBeGreaterThan(0);
    for (const r of readers) {
      const mails = mailsTo(capture.dir, r.email);
      expect(mails).toHaveLength(5);
      expect(new Set(mails.map((m) => m.messageId)).size).toBe(5);
    }
  });

  it('tells followers of a newly linked trial in the same transaction as the trial, without its region or notes', async () => {
    const f = await newFeedstock('Apple cores test');
    const s = await follow(f, { email: testEmail('trials') });
    const input = trialInput(f.id, {
      setting: 'bed',
      preparation: 'chopped',
      surfaceArea: { amount: 2, unit: 'm2' },
      dose: { amount: 6, unit: 'kg' },
      region: 'Lower Marsh district',
      startDate: '2026-01-10',
      notes: 'Behind 4 Mill Road.',
    });
    // A refused trial (bad input) stores nothing, outbox included.
    await expect(createTrial(actorOf(author), { ...input, dose: { amount: -1, unit: 'kg' } })).rejects.toThrow();
    expect(await OutboxMessage.count({ where: { recipient: s.email } })).toBe(0);
    const trial = await createTrial(actorOf(author), input);
    expect(await OutboxMessage.count({ where: { recipient: s.email, kind: 'trial-linked' } })).toBe(1);
    await drainOutbox(worker());
    const [mail] = mailsTo(capture.dir, s.email);
    expect(mail.subject).toBe(`${f.name}: new feeding trial`);
    expect(mail.text).toContain(`What changed: Trial ${trial.id}: chopped apple cores test in an open bed, 3 kg/m² at once.`);
    expect(mail.text).toContain(`${BASE}/trials/${trial.id}`);
    for (const secret of ['Lower Marsh', 'Mill Road', author.email!]) expect(`${mail.text}${mail.html}`).not.toContain(secret);
    await sequelize.query('DELETE FROM evidence_aggregates WHERE feedstock_id = ?', { replacements: [f.id] });
    await sequelize.query('DELETE FROM evidence_verdicts WHERE feedstock_id = ?', { replacements: [f.id] });
  });

  it('sends check-in reminders (no unsubscribe headers) and page-edit mail written by the other services', async () => {
    const f = await newFeedstock('Banana peel test');
    const owner = author;
    const s = await follow(f, { email: testEmail('edits') });
    // The rows as lib/services/reminders.ts and the page-revision service write them (same transaction as their change).
    await OutboxMessage.bulkCreate([
      {
        kind: 'check-in-due',
        recipient: owner.email!,
        subscriptionId: null,
        feedstockId: f.id,
        dedupeKey: `check-in-due:test-${f.id}:2026-05-31`,
        payload: { trialId: 77, path: '/trials/77', dueDate: '2026-05-31', checkInEveryDays: 7, feedstockName: f.name, feedstockSlug: f.slug },
      },
      {
        kind: 'page-edited',
        recipient: s.email,
        subscriptionId: s.id,
        feedstockId: f.id,
        dedupeKey: `page-edited:test-${f.id}:${s.id}`,
        payload: { feedstockId: f.id, slug: f.slug, name: f.name, revisionId: 1, version: 3, editSummary: 'wax note', change: `The page text of ${f.name} was edited: wax note.`, path: `/feedstocks/${f.slug}/history` },
      },
    ]);
    await drainOutbox(worker());
    const [reminder] = mailsTo(capture.dir, owner.email!).filter((m) => m.subject.startsWith('Check-in due'));
    expect(reminder.subject).toBe(`Check-in due: your ${f.name.toLowerCase()} trial`);
    expect(reminder.text).toContain(`${BASE}/trials/77`);
    expect(reminder.text).toContain('You get this because you run trial 77 on Trialbed and chose a check-in every 7 days');
    // A personal reminder, not list mail: no List-Unsubscribe headers.
    expect(headerValues(reminder, 'List-Unsubscribe')).toEqual([]);
    const [edit] = mailsTo(capture.dir, s.email);
    expect(edit.subject).toBe(`${f.name}: page text edited`);
    expect(edit.text).toContain(`What changed: The page text of ${f.name} was edited: wax note.`);
    expect(edit.text).toContain(`${BASE}/feedstocks/${f.slug}/history`);
    expect(headerValues(edit, 'List-Unsubscribe-Post')).toEqual(['List-Unsubscribe=One-Click']);
    await OutboxMessage.destroy({ where: { recipient: owner.email! } });
  });

  it('mails followers when an editor publishes page text, and the author when an editor turns a suggestion down', async () => {
    // Through the revision service itself: its rows are written in the same transaction as the text.
    const f = await newFeedstock('Melon rind test');
    const s = await follow(f, { email: testEmail('page-text') });
    const editor = await buildUser({ role: 'editor', createdAt: new Date(Date.now() - 30 * DAY) });
    const suggester = await buildUser({ role: 'contributor', email: testEmail('suggester'), createdAt: new Date(Date.now() - 30 * DAY) });
    users.push(editor, suggester);
    const published = await submitPageEdit(actorOf(editor), f.id, { body: 'Chop melon rind small; it is mostly water.', editSummary: 'chopping advice', baseVersion: f.version });
    expect(published.status).toBe('published');
    const suggestion = await submitPageEdit(actorOf(suggester), f.id, { body: 'Melon rind cures bin odours.', baseVersion: published.version });
    expect(suggestion.status).toBe('pending');
    await reviewPageEdit(actorOf(editor), suggestion.revisionId, { decision: 'reject', note: 'Please cite a trial for that.' });
    await drainOutbox(worker());

    const [edit] = mailsTo(capture.dir, s.email);
    expect(edit.subject).toBe(`${f.name}: page text edited`);
    expect(edit.text).toContain('chopping advice');
    expect(headerValues(edit, 'List-Unsubscribe-Post')).toEqual(['List-Unsubscribe=One-Click']);
    // The follower hears of the published text only; the turned-down suggestion goes to its author alone.
    expect(mailsTo(capture.dir, s.email)).toHaveLength(1);
    const [declined] = mailsTo(capture.dir, suggester.email!);
    expect(declined.subject).toBe(`${f.name}: your page edit was not accepted`);
    expect(declined.text).toContain('Please cite a trial for that.');
    expect(declined.text).toContain(`${BASE}/feedstocks/${f.slug}/edit`);
    expect(headerValues(declined, 'List-Unsubscribe')).toEqual([]);
    expect(await OutboxMessage.count({ where: { feedstockId: f.id, status: 'sent', recipient: [s.email, suggester.email!] } })).toBe(2);
    await sequelize.query('DELETE FROM feedstock_revisions WHERE feedstock_id = ?', { replacements: [f.id] });
  });

  it('runs the digest on its schedule once per period, and forgets addresses that never confirmed', async () => {
    await sequelize.query('DELETE FROM app_meta WHERE `key` = ?', { replacements: [DIGEST_CLOCK_KEY] });
    const t0 = new Date();
    expect(await runScheduledDigest(t0, 168)).toBeNull(); // the first call starts the clock
    expect(await runScheduledDigest(new Date(t0.getTime() + 167 * 3_600_000), 168)).toBeNull();
    const due = new Date(t0.getTime() + 168 * 3_600_000);
    // Two workers at the same moment: exactly one runs it.
    const both = await Promise.all([runScheduledDigest(due, 168), runScheduledDigest(due, 168)]);
    expect(both.filter((r) => r !== null)).toHaveLength(1);
    await sequelize.query('DELETE FROM app_meta WHERE `key` = ?', { replacements: [DIGEST_CLOCK_KEY] });

    const f = await newFeedstock();
    const old = await follow(f, { email: testEmail('never-confirmed'), confirmed: false });
    const recent = await follow(f, { email: testEmail('just-asked'), confirmed: false });
    const kept = await follow(f, { email: testEmail('confirmed-long-ago') });
    const longAgo = new Date(Date.now() - 40 * DAY);
    await sequelize.query('UPDATE subscriptions SET created_at = ?, confirm_sent_at = ? WHERE id IN (?)', { replacements: [longAgo, longAgo, [old.id, kept.id]] });
    expect(await purgeUnconfirmedSubscriptions()).toBeGreaterThanOrEqual(1);
    expect(await Subscription.findByPk(old.id)).toBeNull();
    expect(await Subscription.findByPk(recent.id)).not.toBeNull();
    expect(await Subscription.findByPk(kept.id)).not.toBeNull();
  });

  it('gives up after the last attempt and records why', async () => {
    const f = await newFeedstock();
    const s = await follow(f, { email: testEmail('gives-up') });
    await drainOutbox(worker()); // nothing else pending: only our row meets the stopped server
    await capture.stop();
    await proposeLimit(f);
    try {
      await drainOutbox({ ...worker({ maxAttempts: 2, retryBaseMs: 50 }), waitForRetries: true, timeoutMs: 10_000 });
    } finally {
      await capture.restart();
    }
    const row = await OutboxMessage.findOne({ where: { recipient: s.email } });
    expect(row!.status).toBe('failed');
    expect(row!.attempts).toBe(2);
    expect(row!.lastError).toMatch(/ECONNREFUSED|ECONNECTION|connect/i);
  });
});
