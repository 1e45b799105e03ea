import { randomBytes } from 'node:crypto';
import { sequelize } from '@/db';
import { Proposal, PublishedVerdict, Subscription, Vote, type User } from '@/db/models';
import { getEnv } from '@/lib/env';
import { createUnsubscribeToken } from '@/lib/mail/unsubscribe-token';
import { hashConfirmToken } from '@/lib/queries/subscriptions';
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
  {
    route: 'GET /feedstocks/[slug]/feed.xml',
    request: async () => ({ path: `/feedstocks/${(await freshFeedstock()).slug}/feed.xml` }),
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
