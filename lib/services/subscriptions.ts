import 'server-only';
import { randomBytes } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { execWrite, sequelize } from '@/db';
import { Feedstock, OutboxMessage, Subscription, User } from '@/db/models';
import { getEnv } from '@/lib/env';
import { ConflictError, InvalidInputError, NotFoundError, UnavailableError } from '@/lib/errors';
import { composeConfirmationMail } from '@/lib/mail/templates';
import { sendMail } from '@/lib/mail/transport';
import { authorize, authorizeUser, type Actor } from '@/lib/policies';
import {
  CONFIRM_LINK_HOURS,
  hashConfirmToken,
  maskEmail,
  resolveUnsubscribeToken,
  scopeNames,
  SITE_SCOPE_NAME,
  type UnsubscribeOutcome,
} from '@/lib/queries/subscriptions';
import {
  ChangeModeSchema,
  ConfirmSubscriptionSchema,
  EndSubscriptionSchema,
  normaliseEmail,
  SubscribeSchema,
  type SubscriptionMode,
} from '@/lib/validation/subscriptions';
import { enforceSubscribeMailLimits } from './rate-limits';

/** What is followed: one feedstock, or the whole site (id null). */
export type SubscriptionScope = { feedstockId: number | null; name: string; slug: string | null };

/** Loads what a subscription points at; throws InvalidInputError for an unknown or merged feedstock. */
export async function loadScope(feedstockId: number | null, transaction?: Transaction): Promise<SubscriptionScope> {
  if (feedstockId === null) return { feedstockId: null, name: SITE_SCOPE_NAME, slug: null };
  const f = await Feedstock.findByPk(feedstockId, { attributes: ['id', 'name', 'slug', 'mergedIntoId'], transaction });
  if (!f || f.mergedIntoId) throw new InvalidInputError(undefined, { feedstockId: ['No such feedstock.'] });
  return { feedstockId: f.id, name: f.name, slug: f.slug };
}

/**
 * Runs `fn` on the (scope, address) subscription row, locked, in one
 * transaction; the row is created bare (unconfirmed, no token) first if it
 * is missing. The create is its own statement (INSERT IGNORE on the unique
 * scope key), so concurrent clicks never both insert, and the locked read
 * that follows finds an existing row — no gap locks, no deadlock between
 * "look, then insert" transactions. A deadlock reported anyway is retried.
 */
async function withSubscriptionRow<T>(scope: SubscriptionScope, email: string, mode: SubscriptionMode, fn: (sub: Subscription, transaction: Transaction) => Promise<T>): Promise<T> {
  await sequelize.query(
    'INSERT IGNORE INTO subscriptions (feedstock_id, email, mode, created_at, updated_at) VALUES (?, ?, ?, UTC_TIMESTAMP(3), UTC_TIMESTAMP(3))',
    { replacements: [scope.feedstockId, email, mode] },
  );
  for (let attempt = 1; ; attempt++) {
    try {
      return await sequelize.transaction(async (transaction) => {
        const [row] = await sequelize.query<{ id: number }>('SELECT id FROM subscriptions WHERE scope_key = ? AND email = ? FOR UPDATE', {
          replacements: [scope.feedstockId ?? 0, email],
          type: QueryTypes.SELECT,
          transaction,
        });
        if (!row) throw new ConflictError('That subscription changed meanwhile; please try again.');
        return fn((await Subscription.findByPk(row.id, { transaction }))!, transaction);
      });
    } catch (err) {
      const deadlock = (err as { parent?: { errno?: number } }).parent?.errno === 1213;
      if (!deadlock || attempt >= 3) throw err;
    }
  }
}

/** Stops queued mail of these subscriptions (pending or waiting for the digest): nothing goes out after an unsubscribe. */
async function cancelQueuedMail(subscriptionIds: number[], transaction: Transaction): Promise<void> {
  if (!subscriptionIds.length) return;
  await OutboxMessage.update(
    { status: 'cancelled', lastError: 'Unsubscribed before it was sent.' },
    { where: { subscriptionId: subscriptionIds, status: ['pending', 'digest'] }, transaction },
  );
}

/** The outcome of `subscribe`. */
export type SubscribeResult = {
  /** 'following': counts now (signed-in readers). 'confirmation-sent': a visitor must open the mailed link first. */
  status: 'following' | 'confirmation-sent';
  email: string;
  scope: SubscriptionScope;
  mode: SubscriptionMode;
};

/**
 * Follows a feedstock (or, with feedstockId null, every feedstock) by mail.
 * A signed-in reader with a confirmed address follows at once in one click,
 * with the account's address. A visitor gives an address and gets a
 * confirmation link (double opt-in): nothing counts, and no other mail goes
 * out, until it is opened. Only a hash of the link's token is stored.
 * Someone who already follows is told the same as a newcomer, so the form
 * reveals nothing about other people's addresses.
 * Throws InvalidInputError (bad input, unknown feedstock), RateLimitedError
 * (too many confirmation mails) and UnavailableError (the mail server refused).
 */
export async function subscribe(actor: Actor, raw: unknown, { clientIp = 'unknown' }: { clientIp?: string } = {}): Promise<SubscribeResult> {
  authorize(actor, 'subscription.create');
  const input = SubscribeSchema.parse(raw);
  const scope = await loadScope(input.feedstockId);
  if (actor?.email && actor.emailVerified !== false) return followNow(actor, scope, input.mode);
  const email = input.email ?? (actor?.email ? normaliseEmail(actor.email) : undefined);
  if (!email) throw new InvalidInputError(undefined, { email: ['Enter your e-mail address.'] });
  return requestConfirmation(email, scope, input.mode, clientIp);
}

async function followNow(actor: NonNullable<Actor>, scope: SubscriptionScope, mode: SubscriptionMode): Promise<SubscribeResult> {
  const email = normaliseEmail(actor.email!);
  await withSubscriptionRow(scope, email, mode, async (sub, transaction) => {
    const active = !!sub.confirmedAt && !sub.unsubscribedAt;
    await sub.update(
      { userId: actor.id, mode, confirmedAt: active ? sub.confirmedAt : new Date(), unsubscribedAt: null, confirmTokenHash: null, confirmSentAt: null },
      { transaction },
    );
  });
  return { status: 'following', email, scope, mode };
}

async function requestConfirmation(email: string, scope: SubscriptionScope, mode: SubscriptionMode, clientIp: string): Promise<SubscribeResult> {
  await enforceSubscribeMailLimits({ email, clientIp });
  const token = randomBytes(32).toString('base64url');
  const send = await withSubscriptionRow(scope, email, mode, async (sub, transaction) => {
    // Already following: change nothing (a stranger must not switch someone's mode) and send nothing.
    if (sub.confirmedAt && !sub.unsubscribedAt) return false;
    await sub.update({ mode, confirmTokenHash: hashConfirmToken(token), confirmSentAt: new Date() }, { transaction });
    return true;
  });
  if (send) {
    const confirmUrl = `${getEnv().AUTH_URL.replace(/\/$/, '')}/subscriptions/confirm?token=${token}`;
    try {
      await sendMail({ to: email, ...composeConfirmationMail({ confirmUrl, scopeName: scope.name, mode, hours: CONFIRM_LINK_HOURS }) });
    } catch (err) {
      console.error('[mail] confirmation mail failed:', err instanceof Error ? err.message : err);
      throw new UnavailableError('We could not send the confirmation e-mail just now. Please try again in a minute.');
    }
  }
  return { status: 'confirmation-sent', email, scope, mode };
}

/** A subscription as its owner sees it after a change. */
export type SubscriptionChange = { id: number; scope: SubscriptionScope; mode: SubscriptionMode; email: string };

/**
 * Confirms a visitor's subscription from the mailed link (`{ token }`): it
 * counts from now on. The link works once and for CONFIRM_LINK_HOURS.
 * Throws NotFoundError for an unknown, used or expired link.
 */
export async function confirmSubscription(raw: unknown): Promise<SubscriptionChange> {
  const { token } = ConfirmSubscriptionSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const sub = await Subscription.findOne({ where: { confirmTokenHash: hashConfirmToken(token) }, lock: transaction.LOCK.UPDATE, transaction });
    const fresh = sub?.confirmSentAt && Date.now() - sub.confirmSentAt.getTime() <= CONFIRM_LINK_HOURS * 3_600_000;
    if (!sub || !fresh) {
      throw new NotFoundError('This confirmation link does not work any more: it was used already, or it expired. Ask for a new one from the page you want to follow.');
    }
    // An account with this address sees the subscription on its account page.
    const owner = sub.userId ? null : await User.findOne({ where: { email: sub.email }, attributes: ['id'], transaction });
    await sub.update(
      { confirmedAt: new Date(), unsubscribedAt: null, confirmTokenHash: null, confirmSentAt: null, userId: sub.userId ?? owner?.id ?? null },
      { transaction },
    );
    return { id: sub.id, scope: await loadScopeLenient(sub.feedstockId, transaction), mode: sub.mode, email: sub.email };
  });
}

/** Like loadScope, but a feedstock that was merged away still has a name to show. */
async function loadScopeLenient(feedstockId: number | null, transaction?: Transaction): Promise<SubscriptionScope> {
  if (feedstockId === null) return { feedstockId: null, name: SITE_SCOPE_NAME, slug: null };
  const f = await Feedstock.findByPk(feedstockId, { attributes: ['id', 'name', 'slug'], transaction });
  return { feedstockId, name: f?.name ?? 'a feedstock', slug: f?.slug ?? null };
}

/** The subscription `id` if the actor owns it: made with the account, or with the account's confirmed address. */
async function loadOwnSubscription(actor: Actor, id: number, transaction: Transaction): Promise<Subscription> {
  authorizeUser(actor, 'subscription.manage');
  const sub = await Subscription.findByPk(id, { lock: transaction.LOCK.UPDATE, transaction });
  if (!sub || sub.unsubscribedAt) throw new NotFoundError('No such subscription.');
  const sameAddress = !!actor.email && actor.emailVerified !== false && normaliseEmail(actor.email) === sub.email;
  authorizeUser(actor, 'subscription.manage', { ownerId: sub.userId === actor.id || sameAddress ? actor.id : sub.userId });
  return sub;
}

/** Switches one of the actor's subscriptions between immediate mail and the weekly digest (`{ subscriptionId, mode }`). */
export async function changeSubscriptionMode(actor: Actor, raw: unknown): Promise<SubscriptionChange> {
  authorizeUser(actor, 'subscription.manage');
  const input = ChangeModeSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const sub = await loadOwnSubscription(actor, input.subscriptionId, transaction);
    await sub.update({ mode: input.mode, userId: sub.userId ?? actor.id }, { transaction });
    return { id: sub.id, scope: await loadScopeLenient(sub.feedstockId, transaction), mode: sub.mode, email: sub.email };
  });
}

/** Stops one of the actor's subscriptions from the account page (`{ subscriptionId }`); queued mail for it is cancelled. */
export async function endSubscription(actor: Actor, raw: unknown): Promise<SubscriptionChange> {
  authorizeUser(actor, 'subscription.manage');
  const input = EndSubscriptionSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const sub = await loadOwnSubscription(actor, input.subscriptionId, transaction);
    await sub.update({ unsubscribedAt: new Date() }, { transaction });
    await cancelQueuedMail([sub.id], transaction);
    return { id: sub.id, scope: await loadScopeLenient(sub.feedstockId, transaction), mode: sub.mode, email: sub.email };
  });
}

/**
 * Unsubscribes without signing in, from a mail's link (`{ token }`): the
 * RFC 8058 one-click POST and the button on the confirmation page both end
 * here. Idempotent: a second use says it was already done. Queued mail for
 * the stopped subscriptions is cancelled in the same transaction.
 */
export async function unsubscribeWithToken(raw: unknown): Promise<UnsubscribeOutcome> {
  return sequelize.transaction(async (transaction) => {
    const { subs, email } = await resolveUnsubscribeToken(raw, transaction);
    const active = subs.filter((s) => !s.unsubscribedAt);
    if (active.length) {
      await Subscription.update({ unsubscribedAt: new Date() }, { where: { id: active.map((s) => s.id) }, transaction });
      await cancelQueuedMail(active.map((s) => s.id), transaction);
    }
    return { scopes: await scopeNames(active.length ? active : subs, transaction), maskedEmail: maskEmail(email), alreadyUnsubscribed: active.length === 0 };
  });
}

/** How long an address that never confirmed is kept. */
export const UNCONFIRMED_KEEP_DAYS = 30;

/**
 * Forgets addresses that never confirmed: unconfirmed subscriptions without
 * an account whose last confirmation link went out more than `days` ago. The
 * worker runs it with the weekly digest. Returns how many rows went.
 */
export async function purgeUnconfirmedSubscriptions(days = UNCONFIRMED_KEEP_DAYS, now: Date = new Date()): Promise<number> {
  const cutoff = new Date(now.getTime() - days * 86_400_000);
  return execWrite(
    'DELETE FROM subscriptions WHERE confirmed_at IS NULL AND user_id IS NULL AND created_at < ? AND (confirm_sent_at IS NULL OR confirm_sent_at < ?)',
    { replacements: [cutoff, cutoff] },
  );
}
