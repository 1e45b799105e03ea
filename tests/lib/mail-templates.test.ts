import { describe, expect, it } from 'vitest';
import { composeConfirmationMail, composeDigestMail, composeUpdateMail, describeEvent, formatDay, reasonSentence } from '@/lib/mail/templates';
import { createUnsubscribeToken, isValidUnsubscribeToken, listUnsubscribeHeaders, parseUnsubscribeToken } from '@/lib/mail/unsubscribe-token';
import { MAX_RETRY_DELAY_MS, retryDelayMs } from '@/lib/services/outbox';

const BASE = 'https://trialbed.example.org';
const orange = { name: 'Orange peel', slug: 'orange-peel' };

// The words of update mail (pure functions): what changed, why, the link, and why it came.
describe('mail templates', () => {
  it('says what changed and why for a decided verdict (PRODUCT.md example)', () => {
    const e = describeEvent(
      'verdict-decided',
      { proposalId: 12, decision: 'approved', summary: 'Keep out → Small amounts only in open beds, after proposal 12 citing 5 trials', note: 'Five bed trials agree.' },
      { baseUrl: BASE, feedstock: orange },
    );
    const mail = composeUpdateMail(e, { reason: { kind: 'feedstock', feedstockName: 'Orange peel', mode: 'immediate' }, unsubscribeUrl: `${BASE}/api/unsubscribe?token=s1.x`, manageUrl: `${BASE}/account` });
    expect(mail.subject).toBe('Orange peel: new verdict published');
    expect(mail.text).toContain('What changed: Keep out → Small amounts only in open beds, after proposal 12 citing 5 trials.');
    expect(mail.text).toContain('Why: The moderator\'s note: “Five bed trials agree.”');
    expect(mail.text).toContain(`The page of Orange peel: ${BASE}/feedstocks/orange-peel`);
    expect(mail.text).toContain('You get this because you follow Orange peel on Trialbed (each update as it happens).');
    expect(mail.text).toContain(`Unsubscribe with one click: ${BASE}/api/unsubscribe?token=s1.x`);
    expect(mail.html).toContain(`<a href="${BASE}/feedstocks/orange-peel"`);
  });

  it('explains a rejected proposal, an opened one and a linked trial', () => {
    const rejected = describeEvent('verdict-decided', { proposalId: 7, decision: 'rejected', note: 'Loads too low.' }, { baseUrl: BASE, feedstock: orange });
    expect(rejected.headline).toBe('verdict proposal not accepted');
    expect(rejected.what).toBe('Proposal 7 was not accepted, so the published verdict stays as it was.');
    const opened = describeEvent('proposal-opened', { proposalId: 8, summary: 'Feed freely in enclosed bins', trialCount: 1 }, { baseUrl: BASE, feedstock: orange });
    expect(opened.what).toBe('Proposal 8 suggests: Feed freely in enclosed bins, citing 1 trial.');
    expect(opened.detailUrl).toBe(`${BASE}/proposals/8`);
    const trial = describeEvent('trial-linked', { trialId: 42, summary: 'Trial 42: chopped orange peel in an open bed, 6 kg/m² at once' }, { baseUrl: BASE, feedstock: orange });
    expect(trial.what).toBe('Trial 42: chopped orange peel in an open bed, 6 kg/m² at once.');
    expect(trial.detailUrl).toBe(`${BASE}/trials/42`);
  });

  it('tells the author of a rejected page edit why, with no unsubscribe link (it is not a subscription)', () => {
    // The payload reviewPageEdit writes: { slug, name, revisionId, note, path }.
    const e = describeEvent(
      'edit-rejected',
      { slug: 'orange-peel', name: 'Orange peel', revisionId: 31, note: 'Please cite a trial for the wax claim.', path: '/feedstocks/orange-peel/edit' },
      { baseUrl: BASE, feedstock: orange },
    );
    const mail = composeUpdateMail(e, { reason: { kind: 'edit-author', feedstockName: 'Orange peel' }, unsubscribeUrl: null, manageUrl: null });
    expect(mail.subject).toBe('Orange peel: your page edit was not accepted');
    expect(mail.text).toContain('What changed: An editor did not publish the edit you suggested to the page text of Orange peel.');
    expect(mail.text).toContain('Why: The editor\'s note: “Please cite a trial for the wax claim.”');
    expect(mail.text).toContain(`Edit the current text again: ${BASE}/feedstocks/orange-peel/edit`);
    expect(mail.text).toContain('You get this because you suggested an edit to the page of Orange peel on Trialbed.');
    expect(mail.text).not.toContain('Unsubscribe');
  });

  it('reads the page-edit payload of the revision service and the check-in reminder payload of the trials work', () => {
    // The shapes other services write: { slug, name, change, path, editSummary, version } and { trialId, feedstockName, dueDate, path }.
    const edit = describeEvent(
      'page-edited',
      { slug: 'orange-peel', name: 'Orange peel', change: 'The page text of Orange peel was edited: added the wax note.', path: '/feedstocks/orange-peel/history', version: 4 },
      { baseUrl: BASE, feedstock: null },
    );
    expect(edit.feedstockName).toBe('Orange peel');
    expect(edit.what).toBe('The page text of Orange peel was edited: added the wax note.');
    expect(edit.detailUrl).toBe(`${BASE}/feedstocks/orange-peel/history`);
    expect(edit.why).toContain('version 4');

    const due = describeEvent('check-in-due', { trialId: 9, feedstockName: 'Orange peel', dueDate: '2026-05-31', checkInEveryDays: 7, path: '/trials/9' }, { baseUrl: BASE, feedstock: orange });
    const mail = composeUpdateMail(due, { reason: { kind: 'trial-owner', trialId: 9, everyDays: 7 }, unsubscribeUrl: null, manageUrl: null });
    expect(mail.subject).toBe('Check-in due: your orange peel trial');
    expect(mail.text).toContain(`Your trial of orange peel (trial 9) is due for a check-in on ${formatDay('2026-05-31')}.`);
    expect(formatDay('2026-05-31')).toMatch(/^Sunday,? 31 May 2026$/);
    expect(mail.text).toContain(`Add a check-in: ${BASE}/trials/9`);
    expect(mail.text).toContain('You get this because you run trial 9 on Trialbed and chose a check-in every 7 days');
    expect(mail.text).not.toContain('Unsubscribe');
  });

  it('never links off the site from a payload path, and escapes names in HTML', () => {
    for (const path of ['//evil.example/x', 'https://evil.example/x', 'javascript:alert(1)']) {
      const e = describeEvent('trial-linked', { trialId: 3, path }, { baseUrl: BASE, feedstock: orange });
      expect(e.detailUrl).toBe(`${BASE}/trials/3`);
    }
    const e = describeEvent('page-edited', { editSummary: '<img src=x onerror=alert(1)>' }, { baseUrl: BASE, feedstock: { name: 'Peel <b>&</b>', slug: 'peel' } });
    const mail = composeUpdateMail(e, { reason: { kind: 'site', mode: 'immediate' }, unsubscribeUrl: null, manageUrl: null });
    expect(mail.html).not.toContain('<img');
    expect(mail.html).not.toContain('<b>');
    expect(mail.html).toContain('Peel &#60;b&#62;&#38;&#60;/b&#62;');
  });

  it('groups a digest by feedstock and says which subscriptions it covers', () => {
    const events = [
      describeEvent('proposal-opened', { proposalId: 1, summary: 'Feed freely in open beds' }, { baseUrl: BASE, feedstock: orange, at: '2026-12-01T09:00:00Z' }),
      describeEvent('trial-linked', { trialId: 5, summary: 'Trial 5: raw cardboard in an enclosed bin, 1 kg/m² at once' }, { baseUrl: BASE, feedstock: { name: 'Cardboard', slug: 'cardboard' }, at: '2026-12-02T09:00:00Z' }),
      describeEvent('verdict-decided', { proposalId: 1, summary: 'Keep out → Feed freely in open beds, after proposal 1 citing 3 trials' }, { baseUrl: BASE, feedstock: orange, at: '2026-12-03T09:00:00Z' }),
    ];
    const mail = composeDigestMail(events, { reason: { kind: 'digest', scopes: ['Orange peel', 'Cardboard'] }, unsubscribeUrl: `${BASE}/u`, manageUrl: `${BASE}/account`, periodEnd: new Date('2026-12-07T00:00:00Z') });
    expect(mail.subject).toBe('Your week on Trialbed: 3 updates about Orange peel and Cardboard');
    expect(mail.text.indexOf('== Orange peel (2 updates)')).toBeLessThan(mail.text.indexOf('== Cardboard (1 update)'));
    expect(mail.text).toContain('* Tue 1 Dec: Verdict proposal opened');
    expect(mail.text).toContain('You get this weekly digest because you follow Orange peel and Cardboard on Trialbed.');
    expect(reasonSentence({ kind: 'site', mode: 'digest' })).toBe('You get this because you follow every feedstock on Trialbed (weekly digest).');
  });

  it('asks a visitor to confirm, and says nothing else is sent until then', () => {
    const mail = composeConfirmationMail({ confirmUrl: `${BASE}/subscriptions/confirm?token=abc`, scopeName: 'Orange peel', mode: 'digest', hours: 72 });
    expect(mail.subject).toBe('Confirm: follow Orange peel on Trialbed');
    expect(mail.text).toContain(`${BASE}/subscriptions/confirm?token=abc`);
    expect(mail.text).toContain('Until you confirm, we send you nothing else.');
  });
});

describe('unsubscribe tokens', () => {
  const secret = 'test-secret-0123456789';
  it('verify only for the subscription, address and secret they were made for', () => {
    const t = createUnsubscribeToken(secret, { scope: 's', id: 41, email: 'Reader@Example.test' });
    expect(t).toMatch(/^s41\.[A-Za-z0-9_-]{43}$/);
    expect(parseUnsubscribeToken(t)).toMatchObject({ scope: 's', id: 41 });
    expect(isValidUnsubscribeToken(secret, t, { scope: 's', id: 41, email: 'reader@example.test' })).toBe(true);
    expect(isValidUnsubscribeToken(secret, t, { scope: 's', id: 42, email: 'reader@example.test' })).toBe(false);
    expect(isValidUnsubscribeToken(secret, t, { scope: 'd', id: 41, email: 'reader@example.test' })).toBe(false);
    expect(isValidUnsubscribeToken(secret, t, { scope: 's', id: 41, email: 'other@example.test' })).toBe(false);
    expect(isValidUnsubscribeToken('another-secret', t, { scope: 's', id: 41, email: 'reader@example.test' })).toBe(false);
    for (const bad of ['', 's41', 's0.abc', 'x41.' + 'a'.repeat(43), `s41.${'a'.repeat(42)}`]) expect(parseUnsubscribeToken(bad)).toBeNull();
    expect(() => createUnsubscribeToken('', { scope: 's', id: 1, email: 'a@b.c' })).toThrow(/AUTH_SECRET/);
  });

  it('make the RFC 2369 / RFC 8058 header pair', () => {
    // RFC 2369 §2 (URL in angle brackets) and RFC 8058 §3.1 (one HTTPS URI; the exact pair List-Unsubscribe=One-Click).
    expect(listUnsubscribeHeaders(BASE, 'd9.tok')).toEqual({
      'List-Unsubscribe': `<${BASE}/api/unsubscribe?token=d9.tok>`,
      'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
      url: `${BASE}/api/unsubscribe?token=d9.tok`,
    });
  });
});

describe('retry backoff', () => {
  it('doubles from the base and stops at six hours', () => {
    const noJitter = () => 0;
    expect([1, 2, 3, 4].map((a) => retryDelayMs(a, 30_000, noJitter))).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(retryDelayMs(30, 30_000, noJitter)).toBe(MAX_RETRY_DELAY_MS);
    expect(retryDelayMs(1, 30_000, () => 1)).toBe(33_000); // at most 10 % jitter
    expect(retryDelayMs(40, 30_000, () => 1)).toBe(MAX_RETRY_DELAY_MS);
  });
});
