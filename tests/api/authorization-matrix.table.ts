import { randomBytes } from 'node:crypto';
import { sequelize } from '@/db';
import { CheckIn, Feedstock, FeedstockRequest, FeedstockRevision, Photo, Proposal, PublishedVerdict, Subscription, Trial, Vote, type User } from '@/db/models';
import { getEnv } from '@/lib/env';
import { createUnsubscribeToken } from '@/lib/mail/unsubscribe-token';
import { hashConfirmToken } from '@/lib/queries/subscriptions';
import { uploadPhoto } from '@/lib/services/photos';
import { createTrial } from '@/lib/services/trials';
import { smallPng } from '../support/images';
import { buildFeedstock } from '../support/factories';
import type { Role } from '@/lib/policies';

/**
 * THE AUTHORIZATION MATRIX: every route handler and every server action of
 * the app × every role (and anonymous) → the expected outcome.
 * tests/api/authorization-matrix.test.ts reads the app's files and fails
 * when a route handler (any `route.ts` under app/, per exported method) or a
 * server action (any export of an `actions.ts` file under app/) has no row
 * here, or when a row names something that no longer exists.
 *
 * To add a row: copy one below. `request`/`fields` get a fresh cell — a new
 * user of that role with a real session, plus `makeUser` for targets — so
 * rows never share state. Optional `check` runs after the call and asserts
 * what was (or was not) written.
 */

export type Who = 'anonymous' | Role;
export const WHO: readonly Who[] = ['anonymous', 'reader', 'contributor', 'editor', 'moderator', 'admin'];

/** One cell: who is calling, their user row (null for anonymous), and a factory for other users. */
export type Cell = {
  who: Who;
  user: User | null;
  makeUser: (attrs?: { role?: Role; licenceAccepted?: boolean }) => Promise<User>;
};

/** Expected HTTP status per caller. */
export type StatusByWho = Record<Who, number>;

/** Expected server-action outcome: `ok` (returned ok or redirected), or the error code it returned. */
export type ActionOutcome = 'ok' | 'unauthenticated' | 'forbidden' | 'invalid_input' | 'not_found' | 'conflict' | 'rate_limited';
export type OutcomeByWho = Record<Who, ActionOutcome>;

export type RouteRow = {
  /** "METHOD /pattern" exactly as the route file's folder: "PATCH /api/admin/users/[id]". */
  route: string;
  /** The concrete request for a cell: path (with query), optional JSON body or form body. */
  request: (cell: Cell) => Promise<{ path: string; json?: unknown; form?: Record<string, string> }>;
  expect: StatusByWho;
  /** After the call: assert what changed (allowed) or did not (refused). */
  check?: (cell: Cell, ctx: { allowed: boolean; status: number; body: unknown }) => Promise<void>;
};

export type ActionRow = {
  /** "app/<path>/actions.ts#exportName". */
  action: string;
  /** The form fields the action receives (it is called as `(prevState, formData)`). */
  fields: (cell: Cell) => Promise<Record<string, string>>;
  expect: OutcomeByWho;
  check?: (cell: Cell, ctx: { allowed: boolean; outcome: ActionOutcome }) => Promise<void>;
};

const all = <T>(v: T): Record<Who, T> => ({ anonymous: v, reader: v, contributor: v, editor: v, moderator: v, admin: v });
const signedIn = <T>(anon: T, v: T): Record<Who, T> => ({ ...all(v), anonymous: anon });
const adminOnly = <T>(anon: T, others: T, admin: T): Record<Who, T> => ({ ...all(others), anonymous: anon, admin });
const readerOnly = <T>(anon: T, others: T, reader: T): Record<Who, T> => ({ ...all(others), anonymous: anon, reader });

/** Role and disabled state of a user, fresh from the database. */
async function access(user: User) {
  await user.reload();
  return { role: user.role, disabled: !!user.disabledAt, units: user.units };
}

export const ROUTE_ROWS: RouteRow[] = [
  {
    route: 'GET /api/health',
    request: async () => ({ path: '/api/health' }),
    expect: all(200),
  },
  {
    // Auth.js's own endpoints: the session reads as null or as the caller.
    route: 'GET /api/auth/[...nextauth]',
    request: async () => ({ path: '/api/auth/session' }),
    expect: all(200),
  },
  {
    // The e-mail sign-in POST: a malformed address is refused by our guard before Auth.js.
    route: 'POST /api/auth/[...nextauth]',
    request: async () => ({ path: '/api/auth/signin/nodemailer', form: { email: 'not-an-address', csrfToken: 'x' } }),
    expect: all(400),
  },
  {
    // Visitors get { account: null }; the header asks this on every page.
    route: 'GET /api/account',
    request: async () => ({ path: '/api/account' }),
    expect: all(200),
  },
  {
    route: 'PATCH /api/account',
    request: async () => ({ path: '/api/account', json: { units: 'imperial' } }),
    expect: signedIn(401, 200),
    check: async (cell, { allowed }) => {
      if (cell.user) expectEqual((await access(cell.user)).units, allowed ? 'imperial' : 'metric', 'units');
    },
  },
  {
    route: 'POST /api/account/licence',
    request: async () => ({ path: '/api/account/licence', json: { accept: true } }),
    expect: readerOnly(401, 403, 200),
    check: async (cell, { allowed }) => {
      if (cell.user) expectEqual((await access(cell.user)).role, allowed ? 'contributor' : cell.who, 'role');
    },
  },
  {
    route: 'GET /api/admin/users',
    request: async () => ({ path: '/api/admin/users?q=example' }),
    expect: adminOnly(401, 403, 200),
  },
  {
    route: 'PATCH /api/admin/users/[id]',
    request: async (cell) => {
      const target = await cell.makeUser({ role: 'contributor' });
      targets.set(cell, target);
      return { path: `/api/admin/users/${target.id}`, json: { role: 'editor' } };
    },
    expect: adminOnly(401, 403, 200),
    check: async (cell, { allowed }) => expectEqual((await access(targets.get(cell)!)).role, allowed ? 'editor' : 'contributor', 'target role'),
  },

  // --- Verdict proposals, votes and moderation (issue: proposals and voting).
  {
    route: 'POST /api/proposals',
    request: async () => {
      const f = await freshFeedstock();
      return { path: '/api/proposals', json: { feedstockId: f.id, settings: [{ setting: 'bin', verdict: 'feed', ceilingKgM2: 3, cautions: [] }], rationale: 'Four consumed bin trials at 3 kg/m², no heating seen.' } };
    },
    expect: { anonymous: 401, reader: 403, contributor: 201, editor: 201, moderator: 201, admin: 201 },
  },
  {
    route: 'GET /api/proposals/[id]',
    request: async (cell) => ({ path: `/api/proposals/${(await openProposalFor(cell)).id}` }),
    expect: all(200),
  },
  {
    route: 'POST /api/proposals/[id]/votes',
    request: async (cell) => {
      // Votes need an account older than a day; age the caller's account.
      if (cell.user) await sequelize.query('UPDATE users SET created_at = ? WHERE id = ?', { replacements: [new Date(Date.now() - 3 * 86_400_000), cell.user.id] });
      return { path: `/api/proposals/${(await openProposalFor(cell)).id}/votes`, json: { agree: true, reason: 'Matches trial 12.' } };
    },
    expect: { anonymous: 401, reader: 403, contributor: 200, editor: 200, moderator: 200, admin: 200 },
    check: async (cell, { allowed }) => {
      const p = proposals.get(cell)!;
      expectEqual(await Vote.count({ where: { proposalId: p.id } }), allowed ? 1 : 0, 'votes stored');
    },
  },
  {
    route: 'POST /api/proposals/[id]/decision',
    request: async (cell) => ({ path: `/api/proposals/${(await openProposalFor(cell)).id}/decision`, json: { decision: 'approve', note: 'Trials support it.' } }),
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 200, admin: 200 },
    check: async (cell, { allowed }) => {
      const p = await Proposal.findByPk(proposals.get(cell)!.id);
      expectEqual(p!.status, allowed ? 'approved' : 'open', 'proposal status');
      expectEqual(await PublishedVerdict.count({ where: { feedstockId: p!.feedstockId } }), allowed ? 1 : 0, 'published verdicts');
    },
  },
  {
    route: 'POST /api/proposals/[id]/claim',
    request: async (cell) => ({ path: `/api/proposals/${(await openProposalFor(cell)).id}/claim`, json: {} }),
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 200, moderator: 200, admin: 200 },
  },
  {
    route: 'POST /api/proposals/[id]/visibility',
    request: async (cell) => ({ path: `/api/proposals/${(await openProposalFor(cell)).id}/visibility`, json: { hidden: true, reason: 'Abusive wording.' } }),
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 200, admin: 200 },
    check: async (cell, { allowed }) => expectEqual(!!(await Proposal.findByPk(proposals.get(cell)!.id))!.hiddenAt, allowed, 'proposal hidden'),
  },
  {
    route: 'POST /api/votes/[id]/visibility',
    request: async (cell) => {
      const p = await openProposalFor(cell);
      const voter = await cell.makeUser({ role: 'contributor' });
      const vote = await Vote.create({ proposalId: p.id, voterId: voter.id, agree: false, reason: 'rude words' });
      votes.set(cell, vote);
      return { path: `/api/votes/${vote.id}/visibility`, json: { hidden: true, reason: 'Abusive comment.' } };
    },
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 200, admin: 200 },
    check: async (cell, { allowed }) => expectEqual(!!(await Vote.findByPk(votes.get(cell)!.id))!.hiddenAt, allowed, 'vote hidden'),
  },
  {
    // Only a proposal's own author resubmits it; here every signed-in caller is the author.
    route: 'POST /api/proposals/[id]/resubmit',
    request: async (cell) => {
      const p = await openProposalFor(cell, cell.user ?? undefined);
      await p.update({ status: 'rejected', decisionNote: 'Needs more trials.' });
      return { path: `/api/proposals/${p.id}/resubmit`, json: {} };
    },
    expect: { anonymous: 401, reader: 403, contributor: 201, editor: 201, moderator: 201, admin: 201 },
  },

  // --- Feedstock wiki (issue: wiki, search, guides).
  {
    route: 'GET /api/ping',
    request: async () => ({ path: '/api/ping' }),
    expect: all(200),
  },
  {
    route: 'GET /api/search',
    request: async () => ({ path: '/api/search?q=can%20worms%20eat%20banana%20peels' }),
    expect: all(200),
  },
  {
    route: 'GET /feedstocks/[slug]/feed.xml',
    request: async () => ({ path: `/feedstocks/${(await freshFeedstock()).slug}/feed.xml` }),
    expect: all(200),
  },
  // --- Trials, check-ins, photos and exports (issue: trial logging).
  { route: 'GET /api/trials', request: async () => ({ path: '/api/trials?setting=bin' }), expect: all(200) },
  { route: 'GET /api/trials/[id]', request: async (cell) => ({ path: `/api/trials/${(await trialFor(cell)).id}` }), expect: all(200) },
  { route: 'GET /api/trials/[id]/check-ins', request: async (cell) => ({ path: `/api/trials/${(await trialFor(cell)).id}/check-ins` }), expect: all(200) },
  { route: 'GET /api/trials/[id]/photos', request: async (cell) => ({ path: `/api/trials/${(await trialFor(cell)).id}/photos` }), expect: all(200) },
  {
    route: 'POST /api/trials',
    request: async () => ({ path: '/api/trials', json: await trialBody() }),
    expect: { anonymous: 401, reader: 403, contributor: 201, editor: 201, moderator: 201, admin: 201 },
  },
  {
    // Someone else's trial: only moderators (and up) may correct it.
    route: 'PATCH /api/trials/[id]',
    request: async (cell) => {
      const t = await trialFor(cell);
      return { path: `/api/trials/${t.id}`, json: { version: t.version, notes: `Corrected by ${cell.who}.` } };
    },
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 200, admin: 200 },
    check: async (cell, { allowed }) => expectEqual((await Trial.findByPk(trials.get(cell)!.id))!.notes.startsWith('Corrected'), allowed, 'notes changed'),
  },
  {
    route: 'POST /api/trials/[id]/check-ins',
    request: async (cell) => ({ path: `/api/trials/${(await trialFor(cell)).id}/check-ins`, json: { observedOn: '2026-10-09', wormActivity: 'many', shareRemainingPct: 40 } }),
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 201, admin: 201 },
    check: async (cell, { allowed }) => expectEqual(await CheckIn.count({ where: { trialId: trials.get(cell)!.id } }), allowed ? 1 : 0, 'check-ins'),
  },
  {
    route: 'POST /api/trials/[id]/close',
    request: async (cell) => ({ path: `/api/trials/${(await trialFor(cell)).id}/close`, json: { status: 'abandoned', reason: 'Bed flooded.' } }),
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 200, admin: 200 },
    check: async (cell, { allowed }) => expectEqual((await Trial.findByPk(trials.get(cell)!.id))!.status, allowed ? 'abandoned' : 'running', 'trial status'),
  },
  {
    // The body here is JSON, not an image: allowed callers get past the permission check and are refused by content (415).
    route: 'POST /api/trials/[id]/photos',
    request: async (cell) => ({ path: `/api/trials/${(await trialFor(cell)).id}/photos`, json: { not: 'an image' } }),
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 415, admin: 415 },
    check: async (cell) => expectEqual(await Photo.count({ where: { trialId: trials.get(cell)!.id } }), 0, 'photos'),
  },
  { route: 'GET /api/photos/[id]', request: async (cell) => ({ path: `/api/photos/${(await photoFor(cell)).id}` }), expect: all(200) },
  { route: 'GET /api/photos/[id]/thumbnail', request: async (cell) => ({ path: `/api/photos/${(await photoFor(cell)).id}/thumbnail` }), expect: all(200) },
  {
    route: 'DELETE /api/photos/[id]',
    request: async (cell) => ({ path: `/api/photos/${(await photoFor(cell)).id}` }),
    expect: { anonymous: 401, reader: 403, contributor: 403, editor: 403, moderator: 204, admin: 204 },
    check: async (cell, { allowed }) => expectEqual(await Photo.count({ where: { id: photos.get(cell)!.id } }), allowed ? 0 : 1, 'photo kept'),
  },
  { route: 'GET /api/export/trials', request: async () => ({ path: '/api/export/trials?format=json' }), expect: all(200) },
  { route: 'GET /api/export/trials.csv', request: async () => ({ path: '/api/export/trials.csv' }), expect: all(200) },
  { route: 'GET /api/export/trials.json', request: async () => ({ path: '/api/export/trials.json' }), expect: all(200) },
  { route: 'GET /api/feedstocks/[slug]/export', request: async () => ({ path: '/api/feedstocks/banana-peel/export?format=csv' }), expect: all(200) },
  { route: 'GET /api/feedstocks/[slug]/export.csv', request: async () => ({ path: '/api/feedstocks/banana-peel/export.csv' }), expect: all(200) },
  { route: 'GET /api/feedstocks/[slug]/export.json', request: async () => ({ path: '/api/feedstocks/banana-peel/export.json' }), expect: all(200) },
  {
    // JSON page edits: editors publish, contributors' edits wait for review; both answer 201.
    route: 'POST /api/feedstocks/[slug]/revisions',
    request: async (cell) => {
      const f = await freshFeedstock();
      wikiFeedstocks.set(cell, f);
      return { path: `/api/feedstocks/${f.slug}/revisions`, json: { body: `New text by ${cell.who}.`, baseVersion: f.version, editSummary: 'matrix' } };
    },
    expect: { anonymous: 401, reader: 403, contributor: 201, editor: 201, moderator: 201, admin: 201 },
    check: async (cell, { allowed }) => expectEqual(await FeedstockRevision.count({ where: { feedstockId: wikiFeedstocks.get(cell)!.id } }), allowed ? 1 : 0, 'revisions stored'),
  },

  // --- Subscriptions, unsubscribe and feeds (issue 8). Unsubscribing needs no session: the signed token decides.
  {
    // Visitors get an empty list; readers and up their own subscriptions.
    route: 'GET /api/subscriptions',
    request: async () => ({ path: '/api/subscriptions' }),
    expect: all(200),
    check: async (cell, { body }) => expectEqual((body as { signedIn: boolean }).signedIn, cell.who !== 'anonymous', 'signedIn'),
  },
  {
    // A GET never unsubscribes: it sends the person to the confirmation page.
    route: 'GET /api/unsubscribe',
    request: async (cell) => ({ path: `/api/unsubscribe?token=${await unsubscribeTokenFor(cell)}` }),
    expect: all(303),
    check: async (cell) => expectEqual(!!(await subscriptions.get(cell)!.reload()).unsubscribedAt, false, 'unsubscribed by a GET'),
  },
  {
    // RFC 8058 one-click POST: the same answer whoever sends it (mail clients send no cookies).
    route: 'POST /api/unsubscribe',
    request: async (cell) => ({ path: `/api/unsubscribe?token=${await unsubscribeTokenFor(cell)}`, form: { 'List-Unsubscribe': 'One-Click' } }),
    expect: all(200),
    check: async (cell) => expectEqual(!!(await subscriptions.get(cell)!.reload()).unsubscribedAt, true, 'unsubscribed'),
  },
  {
    route: 'GET /feed.xml',
    request: async () => ({ path: '/feed.xml' }),
    expect: all(200),
  },
];

export const ACTION_ROWS: ActionRow[] = [
  {
    // Sends a real link through the capture server for everyone (no role needed to sign in).
    action: 'app/signin/actions.ts#requestSignInLink',
    fields: async (cell) => ({ email: `matrix-${cell.who}-${Date.now()}@example.test` }),
    expect: all('ok'),
  },
  {
    // Demo mode is on in the test environment (TRIALBED_DEMO=1); the demo-off case is in auth-production.test.ts.
    action: 'app/signin/actions.ts#signInAsDemo',
    fields: async () => ({ role: 'reader' }),
    expect: all('ok'),
  },
  {
    action: 'app/signin/actions.ts#signOutUser',
    fields: async () => ({}),
    expect: all('ok'),
  },
  {
    action: 'app/account/actions.ts#saveUnits',
    fields: async () => ({ units: 'imperial' }),
    expect: signedIn('unauthenticated', 'ok'),
    check: async (cell, { allowed }) => {
      if (cell.user) expectEqual((await access(cell.user)).units, allowed ? 'imperial' : 'metric', 'units');
    },
  },
  {
    action: 'app/account/actions.ts#acceptContributionLicence',
    fields: async () => ({ accept: 'on' }),
    expect: readerOnly('unauthenticated', 'forbidden', 'ok'),
    check: async (cell, { allowed }) => {
      if (cell.user) expectEqual((await access(cell.user)).role, allowed ? 'contributor' : cell.who, 'role');
    },
  },
  {
    action: 'app/admin/users/actions.ts#changeUserRole',
    fields: async (cell) => {
      const target = await cell.makeUser({ role: 'contributor' });
      targets.set(cell, target);
      return { userId: target.id, role: 'moderator' };
    },
    expect: adminOnly('unauthenticated', 'forbidden', 'ok'),
    check: async (cell, { allowed }) => expectEqual((await access(targets.get(cell)!)).role, allowed ? 'moderator' : 'contributor', 'target role'),
  },
  {
    action: 'app/admin/users/actions.ts#setUserDisabled',
    fields: async (cell) => {
      const target = await cell.makeUser({ role: 'reader' });
      targets.set(cell, target);
      return { userId: target.id, disabled: 'true' };
    },
    expect: adminOnly('unauthenticated', 'forbidden', 'ok'),
    check: async (cell, { allowed }) => expectEqual((await access(targets.get(cell)!)).disabled, allowed, 'target disabled'),
  },
  // --- Feedstock wiki actions: contributors suggest, editors publish and manage.
  {
    action: 'app/feedstocks/actions.ts#submitPageEditAction',
    fields: async (cell) => {
      const f = await freshFeedstock();
      wikiFeedstocks.set(cell, f);
      return { feedstockId: String(f.id), baseVersion: String(f.version), body: `New text by ${cell.who}.`, editSummary: 'matrix' };
    },
    // Editors publish and are sent to the page (a redirect counts as ok); contributors' edits wait (ok).
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'ok', editor: 'ok', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => {
      const f = wikiFeedstocks.get(cell)!;
      expectEqual(await FeedstockRevision.count({ where: { feedstockId: f.id } }), allowed ? 1 : 0, 'revisions stored');
    },
  },
  {
    action: 'app/feedstocks/actions.ts#reviewEditAction',
    fields: async (cell) => {
      const f = await freshFeedstock();
      const author = await cell.makeUser({ role: 'contributor' });
      const r = await FeedstockRevision.create({ feedstockId: f.id, authorId: author.id, body: 'Suggested text.', status: 'pending', baseVersion: f.version });
      revisions.set(cell, r);
      return { revisionId: String(r.id), decision: 'approve', note: '' };
    },
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'ok', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => expectEqual((await FeedstockRevision.findByPk(revisions.get(cell)!.id))!.status, allowed ? 'published' : 'pending', 'revision status'),
  },
  {
    action: 'app/feedstocks/actions.ts#revertAction',
    fields: async (cell) => {
      const f = await freshFeedstock();
      const first = await FeedstockRevision.create({ feedstockId: f.id, authorId: null, body: 'Old text.', status: 'published', baseVersion: 0 });
      await f.update({ pageText: 'Newer text.', version: 2 });
      wikiFeedstocks.set(cell, f);
      return { feedstockId: String(f.id), revisionId: String(first.id), baseVersion: '2' };
    },
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'ok', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => expectEqual((await Feedstock.findByPk(wikiFeedstocks.get(cell)!.id))!.pageText, allowed ? 'Old text.' : 'Newer text.', 'page text'),
  },
  {
    // Anyone may ask for a feedstock the site does not have.
    action: 'app/feedstocks/actions.ts#requestFeedstockAction',
    fields: async (cell) => ({ name: `Matrix request ${cell.who} ${Date.now()}`, note: '' }),
    expect: all('ok'),
  },
  {
    action: 'app/feedstocks/actions.ts#decideRequestAction',
    fields: async (cell) => {
      const r = await FeedstockRequest.create({ name: `Matrix decide ${cell.who} ${Date.now()}`, note: null, requesterId: null });
      requests.set(cell, r);
      return { requestId: String(r.id), status: 'declined' };
    },
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'ok', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => expectEqual((await FeedstockRequest.findByPk(requests.get(cell)!.id))!.status, allowed ? 'declined' : 'open', 'request status'),
  },
  {
    action: 'app/feedstocks/actions.ts#createFeedstockAction',
    fields: async (cell) => ({ name: `Matrix feedstock ${cell.who} ${Date.now()}`, category: 'other', family: '', summary: '', pageText: '' }),
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'ok', moderator: 'ok', admin: 'ok' },
  },
  {
    action: 'app/feedstocks/actions.ts#renameFeedstockAction',
    fields: async (cell) => {
      const f = await freshFeedstock();
      wikiFeedstocks.set(cell, f);
      return { feedstockId: String(f.id), name: `${f.name} renamed`, slug: `${f.slug}-renamed` };
    },
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'ok', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => {
      const f = wikiFeedstocks.get(cell)!;
      expectEqual((await Feedstock.findByPk(f.id))!.slug, allowed ? `${f.slug}-renamed` : f.slug, 'slug');
    },
  },
  {
    action: 'app/feedstocks/actions.ts#mergeFeedstockAction',
    fields: async (cell) => {
      const source = await freshFeedstock();
      const target = await freshFeedstock();
      wikiFeedstocks.set(cell, source);
      return { sourceId: String(source.id), targetId: String(target.id), note: 'duplicate' };
    },
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'ok', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => expectEqual((await Feedstock.findByPk(wikiFeedstocks.get(cell)!.id))!.mergedIntoId !== null, allowed, 'merged'),
  },
  // --- Trial forms.
  {
    action: 'app/trials/actions.ts#createTrialAction',
    fields: async () => trialForm(await trialBody()),
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'ok', editor: 'ok', moderator: 'ok', admin: 'ok' },
  },
  {
    action: 'app/trials/actions.ts#updateTrialAction',
    fields: async (cell) => {
      const t = await trialFor(cell);
      return { ...trialForm(await trialBody(t.feedstockId)), trialId: String(t.id), version: String(t.version), notes: `Corrected by ${cell.who}.` };
    },
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'forbidden', moderator: 'ok', admin: 'ok' },
  },
  {
    action: 'app/trials/actions.ts#addCheckInAction',
    fields: async (cell) => ({ trialId: String((await trialFor(cell)).id), observedOn: '2026-10-09', wormActivity: 'many', shareRemainingPct: '40', smell: 'none', moisture: 'damp' }),
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'forbidden', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => expectEqual(await CheckIn.count({ where: { trialId: trials.get(cell)!.id } }), allowed ? 1 : 0, 'check-ins'),
  },
  {
    action: 'app/trials/actions.ts#closeTrialAction',
    fields: async (cell) => ({ trialId: String((await trialFor(cell)).id), status: 'abandoned', reason: 'Bed flooded.' }),
    expect: { anonymous: 'unauthenticated', reader: 'forbidden', contributor: 'forbidden', editor: 'forbidden', moderator: 'ok', admin: 'ok' },
    check: async (cell, { allowed }) => expectEqual((await Trial.findByPk(trials.get(cell)!.id))!.status, allowed ? 'abandoned' : 'running', 'trial status'),
  },
  // --- Subscriptions (issue 8)
  {
    // Visitors by e-mail (a confirmation link goes out); signed-in people in one click with their own address.
    action: 'app/subscriptions/actions.ts#subscribeToUpdates',
    fields: async (cell) => {
      const f = await freshFeedstock();
      feedstockOf.set(cell, f.id);
      return { feedstockId: String(f.id), mode: 'immediate', email: `matrix-follow-${cell.who}-${Date.now()}@example.test` };
    },
    expect: all('ok'),
    check: async (cell) => {
      const sub = await Subscription.findOne({ where: { feedstockId: feedstockOf.get(cell)! } });
      expectEqual(!!sub?.confirmedAt, cell.who !== 'anonymous', 'confirmed at once');
      if (cell.user) expectEqual(sub?.email, cell.user.email, 'address used');
    },
  },
  {
    // The mailed link proves the address; no session needed.
    action: 'app/subscriptions/actions.ts#confirmSubscriptionFromLink',
    fields: async (cell) => {
      const token = randomBytes(32).toString('base64url');
      const f = await freshFeedstock();
      const sub = await Subscription.create({ feedstockId: f.id, email: `matrix-confirm-${cell.who}-${Date.now()}@example.test`, mode: 'digest', confirmTokenHash: hashConfirmToken(token), confirmSentAt: new Date() });
      subscriptions.set(cell, sub);
      return { token };
    },
    expect: all('ok'),
    check: async (cell) => expectEqual(!!(await subscriptions.get(cell)!.reload()).confirmedAt, true, 'confirmed'),
  },
  {
    // One's own subscriptions only (the other-owner case is in tests/api/subscriptions.test.ts).
    action: 'app/subscriptions/actions.ts#setSubscriptionMode',
    fields: async (cell) => ({ subscriptionId: String((await ownSubscriptionFor(cell)).id), mode: 'digest' }),
    expect: signedIn('unauthenticated', 'ok'),
    check: async (cell, { allowed }) => expectEqual((await subscriptions.get(cell)!.reload()).mode, allowed ? 'digest' : 'immediate', 'mode'),
  },
  {
    action: 'app/subscriptions/actions.ts#stopSubscription',
    fields: async (cell) => ({ subscriptionId: String((await ownSubscriptionFor(cell)).id) }),
    expect: signedIn('unauthenticated', 'ok'),
    check: async (cell, { allowed }) => expectEqual(!!(await subscriptions.get(cell)!.reload()).unsubscribedAt, allowed, 'unsubscribed'),
  },
  {
    // The button on /unsubscribe: the signed token decides, whoever presses it.
    action: 'app/subscriptions/actions.ts#unsubscribeFromLink',
    fields: async (cell) => ({ token: await unsubscribeTokenFor(cell) }),
    expect: all('ok'),
    check: async (cell) => expectEqual(!!(await subscriptions.get(cell)!.reload()).unsubscribedAt, true, 'unsubscribed'),
  },
];

/** Trials and photos made by a row's request (owned by another contributor), for its check. */
const trials = new WeakMap<Cell, Trial>();
const photos = new WeakMap<Cell, Photo>();

/** A valid new-trial body for a fresh feedstock (or the given one). */
async function trialBody(feedstockId?: number) {
  return {
    feedstockId: feedstockId ?? (await freshFeedstock()).id,
    setting: 'bin',
    preparation: 'chopped',
    provenance: 'home-grown',
    surfaceArea: { amount: 0.25, unit: 'm2' },
    species: 'eisenia-fetida',
    dose: { amount: 0.5, unit: 'kg' },
    region: 'Matrix valley',
    startDate: '2026-10-01',
    checkInEveryDays: 7,
  };
}

/** The same body as the new-trial form sends it (flat fields). */
function trialForm(b: Awaited<ReturnType<typeof trialBody>>): Record<string, string> {
  return {
    feedstockId: String(b.feedstockId), setting: b.setting, preparation: b.preparation, provenance: b.provenance,
    'surfaceArea.amount': String(b.surfaceArea.amount), 'surfaceArea.unit': b.surfaceArea.unit, species: b.species,
    'dose.amount': String(b.dose.amount), 'dose.unit': b.dose.unit, region: b.region, startDate: b.startDate, checkInEveryDays: String(b.checkInEveryDays),
  };
}

/** A running trial owned by a new contributor (not the caller). */
async function trialFor(cell: Cell): Promise<Trial> {
  const owner = await cell.makeUser({ role: 'contributor' });
  const { id } = await createTrial({ id: owner.id, role: 'contributor', emailVerified: true, createdAt: owner.createdAt }, await trialBody());
  const t = (await Trial.findByPk(id))!;
  trials.set(cell, t);
  return t;
}

/** A real uploaded photo on someone else's trial. */
async function photoFor(cell: Cell): Promise<Photo> {
  const t = await trialFor(cell);
  const owner = { id: t.ownerId, role: 'contributor' as const, emailVerified: true };
  const uploaded = await uploadPhoto(owner, t.id, await smallPng(), { caption: 'matrix' });
  const p = (await Photo.findByPk(uploaded.id))!;
  photos.set(cell, p);
  return p;
}

/** Wiki rows' own feedstocks, revisions and requests, for their checks. */
const wikiFeedstocks = new WeakMap<Cell, Feedstock>();
const revisions = new WeakMap<Cell, FeedstockRevision>();
const requests = new WeakMap<Cell, FeedstockRequest>();

/** Proposals and votes made by a row's request, for its check. */
const proposals = new WeakMap<Cell, Proposal>();
const votes = new WeakMap<Cell, Vote>();

/** A feedstock of its own for one cell, so decisions in different cells never conflict. */
async function freshFeedstock() {
  return buildFeedstock();
}

/** An open proposal on a fresh feedstock, by `author` (default: a new contributor). */
async function openProposalFor(cell: Cell, author?: User): Promise<Proposal> {
  const f = await freshFeedstock();
  const by = author ?? (await cell.makeUser({ role: 'contributor' }));
  const p = await Proposal.create({
    feedstockId: f.id,
    authorId: by.id,
    baseVerdictVersion: f.verdictVersion,
    settings: [{ setting: 'bin', verdict: 'feed', ceilingKgM2: 3, cautions: [] }],
    rationale: 'Made by the authorization matrix.',
  });
  proposals.set(cell, p);
  return p;
}

/** Targets made by a row's request, for its check. */
const targets = new WeakMap<Cell, User>();

function expectEqual(actual: unknown, expected: unknown, what: string) {
  if (actual !== expected) throw new Error(`${what}: expected ${String(expected)}, got ${String(actual)}`);
}

/** Subscriptions and feedstocks made by a row's request, for its check. */
const subscriptions = new WeakMap<Cell, Subscription>();
const feedstockOf = new WeakMap<Cell, number>();

/** A confirmed subscription of the caller (or, for anonymous, of another reader) to a fresh feedstock. */
async function ownSubscriptionFor(cell: Cell): Promise<Subscription> {
  const owner = cell.user ?? (await cell.makeUser({ role: 'reader' }));
  const f = await freshFeedstock();
  const sub = await Subscription.create({ feedstockId: f.id, email: owner.email!, userId: owner.id, mode: 'immediate', confirmedAt: new Date() });
  subscriptions.set(cell, sub);
  return sub;
}

/** A signed unsubscribe token for a fresh confirmed subscription (someone else's: no session is involved). */
async function unsubscribeTokenFor(cell: Cell): Promise<string> {
  const f = await freshFeedstock();
  const sub = await Subscription.create({ feedstockId: f.id, email: `matrix-unsub-${cell.who}-${Date.now()}@example.test`, mode: 'immediate', confirmedAt: new Date() });
  subscriptions.set(cell, sub);
  return createUnsubscribeToken(getEnv().AUTH_SECRET, { scope: 's', id: sub.id, email: sub.email });
}
