import 'server-only';
import { createHash } from 'node:crypto';
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import { Feedstock, OutboxMessage, Subscription } from '@/db/models';
import { getEnv } from '@/lib/env';
import { ForbiddenError } from '@/lib/errors';
import { isValidUnsubscribeToken, parseUnsubscribeToken } from '@/lib/mail/unsubscribe-token';
import { can, type Actor } from '@/lib/policies';
import { resolveFeedFeedstock } from './feeds';
import { ConfirmSubscriptionSchema, normaliseEmail, UnsubscribeTokenSchema, type SubscriptionMode } from '@/lib/validation/subscriptions';

/** The name readers see for a whole-site subscription. */
export const SITE_SCOPE_NAME = 'every feedstock';

/** How long a mailed confirmation link works. */
export const CONFIRM_LINK_HOURS = 72;

/** SHA-256 (hex) of a confirmation token: only this is stored. */
export const hashConfirmToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** "r…@example.org": enough for a person to recognise their address, not enough to harvest it. */
export function maskEmail(email: string): string {
  const [local, domain] = email.split('@');
  return domain ? `${local.slice(0, 1)}…@${domain}` : '…';
}

/** One subscription as its owner sees it (account page, subscribe panel). */
export type SubscriptionDTO = {
  id: number;
  feedstockId: number | null;
  /** "Orange peel", or SITE_SCOPE_NAME. */
  name: string;
  slug: string | null;
  mode: SubscriptionMode;
  /** False while a confirmation link is out and unopened. */
  confirmed: boolean;
  since: string;
};

/** What the subscribe panel and GET /api/subscriptions need to know about the person asking. */
export type MySubscriptionsDTO = {
  signedIn: boolean;
  /** The account's address (where one-click subscriptions go); null for visitors. */
  email: string | null;
  /** True when one click is enough (a signed-in account with a confirmed address). */
  oneClick: boolean;
  subscriptions: SubscriptionDTO[];
};

/**
 * The actor's subscriptions that are not stopped — made with the account, or
 * with its confirmed address before the account existed — feedstock ones by
 * name, the whole-site one first. Visitors get an empty list. Two queries.
 */
export async function listMySubscriptions(actor: Actor): Promise<MySubscriptionsDTO> {
  if (!actor || !can(actor, 'subscription.manage')) return { signedIn: false, email: null, oneClick: false, subscriptions: [] };
  const email = actor.email ? normaliseEmail(actor.email) : null;
  const mine: WhereOptions<Subscription>[] = [{ userId: actor.id }];
  if (email && actor.emailVerified !== false) mine.push({ email });
  const rows = await Subscription.findAll({ where: { [Op.or]: mine, unsubscribedAt: null }, order: [['id', 'ASC']] });
  const ids = [...new Set(rows.map((r) => r.feedstockId).filter((id): id is number => id !== null))];
  const feedstocks = new Map((ids.length ? await Feedstock.findAll({ where: { id: ids }, attributes: ['id', 'name', 'slug'] }) : []).map((f) => [f.id, f]));
  const subscriptions = rows
    .map((r) => ({
      id: r.id,
      feedstockId: r.feedstockId,
      name: r.feedstockId === null ? SITE_SCOPE_NAME : (feedstocks.get(r.feedstockId)?.name ?? 'a feedstock'),
      slug: r.feedstockId === null ? null : (feedstocks.get(r.feedstockId)?.slug ?? null),
      mode: r.mode,
      confirmed: !!r.confirmedAt,
      since: (r.confirmedAt ?? r.createdAt).toISOString(),
    }))
    .sort((a, b) => (a.feedstockId === null ? -1 : b.feedstockId === null ? 1 : a.name.localeCompare(b.name)));
  return { signedIn: true, email, oneClick: !!email && actor.emailVerified !== false, subscriptions };
}

/** A feedstock to follow, by slug (the subscribe page). Null when there is none; `redirectTo` for an old or merged slug. */
export async function getFeedstockToFollow(slug: string): Promise<{ id: number; name: string; slug: string } | { redirectTo: string } | null> {
  const found = await resolveFeedFeedstock(slug);
  if (!found || 'redirectTo' in found) return found;
  const f = await Feedstock.findByPk(found.id, { attributes: ['id', 'name', 'slug'] });
  return f ? { id: f.id, name: f.name, slug: f.slug } : null;
}

/** What a confirmation link would confirm (the confirmation page, before the button). Null when it does not work. */
export async function previewConfirmation(raw: unknown): Promise<{ name: string; mode: SubscriptionMode; maskedEmail: string } | null> {
  const parsed = ConfirmSubscriptionSchema.safeParse(raw);
  if (!parsed.success) return null;
  const sub = await Subscription.findOne({ where: { confirmTokenHash: hashConfirmToken(parsed.data.token) } });
  if (!sub?.confirmSentAt || Date.now() - sub.confirmSentAt.getTime() > CONFIRM_LINK_HOURS * 3_600_000) return null;
  return { name: (await scopeNames([sub]))[0], mode: sub.mode, maskedEmail: maskEmail(sub.email) };
}

/** Names of what subscriptions follow, in their order. */
export async function scopeNames(subs: Subscription[], transaction?: Transaction): Promise<string[]> {
  const ids = subs.map((s) => s.feedstockId).filter((id): id is number => id !== null);
  const names = new Map((ids.length ? await Feedstock.findAll({ where: { id: ids }, attributes: ['id', 'name'], transaction }) : []).map((f) => [f.id, f.name]));
  return subs.map((s) => (s.feedstockId === null ? SITE_SCOPE_NAME : (names.get(s.feedstockId) ?? 'a feedstock')));
}

const FORGED = 'This unsubscribe link is not valid. Use the link in your newest mail from Trialbed, or sign in and stop the subscription on your account page.';

/**
 * Checks an unsubscribe token (lib/mail/unsubscribe-token.ts) against the row
 * it names and returns what it stands for: one subscription, or, for a weekly
 * digest mail, every digest subscription of that address. Throws a ZodError
 * (400) for a malformed token and ForbiddenError (403) for one this server did
 * not make (a forged or altered link). With a transaction the rows are locked.
 */
export async function resolveUnsubscribeToken(raw: unknown, transaction?: Transaction): Promise<{ subs: Subscription[]; email: string }> {
  const { token } = UnsubscribeTokenSchema.parse(raw);
  const target = parseUnsubscribeToken(token)!;
  const secret = getEnv().AUTH_SECRET;
  const lock = transaction ? transaction.LOCK.UPDATE : undefined;
  if (target.scope === 's') {
    const sub = await Subscription.findByPk(target.id, { transaction, lock });
    if (!sub || !isValidUnsubscribeToken(secret, token, { ...target, email: sub.email })) throw new ForbiddenError(FORGED);
    return { subs: [sub], email: sub.email };
  }
  const digest = await OutboxMessage.findByPk(target.id, { attributes: ['id', 'kind', 'recipient'], transaction });
  if (!digest || digest.kind !== 'weekly-digest' || !isValidUnsubscribeToken(secret, token, { ...target, email: digest.recipient })) {
    throw new ForbiddenError(FORGED);
  }
  const subs = await Subscription.findAll({
    where: { email: digest.recipient, mode: 'digest', confirmedAt: { [Op.ne]: null } },
    transaction,
    lock,
  });
  return { subs, email: digest.recipient };
}

/** What an unsubscribe link stops. */
export type UnsubscribeOutcome = { scopes: string[]; maskedEmail: string; alreadyUnsubscribed: boolean };

/** What a token would stop, without changing anything (the confirmation page a GET shows). Same errors as resolveUnsubscribeToken. */
export async function previewUnsubscribe(raw: unknown): Promise<UnsubscribeOutcome> {
  const { subs, email } = await resolveUnsubscribeToken(raw);
  const active = subs.filter((s) => !s.unsubscribedAt);
  return { scopes: await scopeNames(active.length ? active : subs), maskedEmail: maskEmail(email), alreadyUnsubscribed: active.length === 0 };
}
