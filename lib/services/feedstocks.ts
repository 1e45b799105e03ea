import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { sequelize } from '@/db';
import {
  AuditLog,
  Feedstock,
  FeedstockAlias,
  FeedstockRedirect,
  FeedstockRequest,
  FeedstockRevision,
  Proposal,
  Subscription,
  Trial,
} from '@/db/models';
import { ConflictError, InvalidInputError, NotFoundError } from '@/lib/errors';
import { authorize, authorizeUser, type Actor } from '@/lib/policies';
import {
  FeedstockCreateSchema,
  FeedstockMergeSchema,
  FeedstockRenameSchema,
  FeedstockRequestSchema,
  RequestDecisionSchema,
  RESERVED_SLUGS,
  slugify,
  type FeedstockCreateInput,
  type FeedstockMergeInput,
  type FeedstockRenameInput,
  type FeedstockRequestInput,
} from '@/lib/validation/feedstocks';
import { recomputeFeedstock } from './evidence';

/** A feedstock as a management write returns it. */
export interface FeedstockRef {
  id: number;
  slug: string;
  name: string;
}

/** Throws a field error unless `slug` is free for feedstock `selfId` (not another's slug or old slug). */
async function assertSlugFree(slug: string, selfId: number | null, transaction: Transaction, field = 'slug'): Promise<void> {
  const taken = await Feedstock.findOne({ where: { slug }, attributes: ['id'], transaction });
  if (taken && taken.id !== selfId) throw new InvalidInputError(undefined, { [field]: [`The address “${slug}” is already used by another feedstock.`] });
  const redirect = await FeedstockRedirect.findOne({ where: { oldSlug: slug }, attributes: ['feedstockId'], transaction });
  if (redirect && redirect.feedstockId !== selfId) {
    throw new InvalidInputError(undefined, { [field]: [`The address “${slug}” still leads to another feedstock (an old address).`] });
  }
}

/**
 * Creates a feedstock with its first page-text revision and aliases (editors),
 * in one transaction, audit-logged. When made from a reader's request, the
 * request is marked added. Throws InvalidInputError with field messages for a
 * taken address or alias.
 */
export async function createFeedstock(actor: Actor, raw: unknown): Promise<FeedstockRef> {
  authorizeUser(actor, 'feedstock.create');
  const input: FeedstockCreateInput = FeedstockCreateSchema.parse(raw);
  const slug = input.slug ?? slugify(input.name);
  if (RESERVED_SLUGS.includes(slug)) throw new InvalidInputError(undefined, { slug: ['That address is used by the site itself; choose another.'] });
  if (slug.length < 2) throw new InvalidInputError(undefined, { slug: ['Choose an address (like "orange-peel").'] });
  const aliases = [...new Set(input.aliases)];
  return sequelize.transaction(async (transaction) => {
    await assertSlugFree(slug, null, transaction);
    if (aliases.length) {
      const taken = await FeedstockAlias.findAll({ where: { alias: { [Op.in]: aliases } }, attributes: ['alias'], transaction });
      if (taken.length) throw new InvalidInputError(undefined, { aliases: [`Already another feedstock’s name: ${taken.map((a) => a.alias).join(', ')}.`] });
    }
    const f = await Feedstock.create(
      {
        slug,
        name: input.name,
        category: input.category,
        family: input.family ?? null,
        cnRatio: null,
        nitrogenPct: null,
        moisturePct: null,
        bulkDensityKgM3: null,
        referenceSource: null,
        summary: input.summary,
        pageText: input.pageText,
        handlingCautions: [...new Set(input.handlingCautions)],
      },
      { transaction },
    );
    if (aliases.length) await FeedstockAlias.bulkCreate(aliases.map((alias) => ({ feedstockId: f.id, alias })), { transaction });
    await FeedstockRevision.create(
      {
        feedstockId: f.id,
        authorId: actor.id,
        body: input.pageText,
        editSummary: 'First version of the page',
        status: 'published',
        baseVersion: 0,
        reviewerId: actor.id,
        reviewedAt: new Date(),
      },
      { transaction },
    );
    if (input.requestId) {
      const request = await FeedstockRequest.findByPk(input.requestId, { transaction, lock: transaction.LOCK.UPDATE });
      if (request && request.status === 'open') await request.update({ status: 'added', feedstockId: f.id }, { transaction });
    }
    await AuditLog.create(
      { actorId: actor.id, action: 'feedstock.create', subjectType: 'feedstock', subjectId: String(f.id), details: { slug, name: f.name, requestId: input.requestId ?? null } },
      { transaction },
    );
    return { id: f.id, slug: f.slug, name: f.name };
  });
}

/**
 * Renames a feedstock and/or moves it to a new address (editors). The old
 * address is kept as a permanent redirect. One transaction, audit-logged.
 */
export async function renameFeedstock(actor: Actor, feedstockId: number, raw: unknown): Promise<FeedstockRef & { previousSlug: string }> {
  authorizeUser(actor, 'feedstock.rename');
  const input: FeedstockRenameInput = FeedstockRenameSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const f = await Feedstock.findByPk(feedstockId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!f) throw new NotFoundError('No such feedstock.');
    if (f.mergedIntoId) throw new ConflictError('This feedstock was merged into another; rename that one instead.');
    const previousSlug = f.slug;
    const previousName = f.name;
    if (input.slug === previousSlug && input.name === previousName) throw new InvalidInputError('Nothing changed.', { name: ['Change the name or the address.'] });
    if (input.slug !== previousSlug) {
      await assertSlugFree(input.slug, f.id, transaction);
      // Moving back to one of its own old addresses: that redirect is no longer needed.
      await FeedstockRedirect.destroy({ where: { oldSlug: input.slug, feedstockId: f.id }, transaction });
      await FeedstockRedirect.create({ oldSlug: previousSlug, feedstockId: f.id }, { transaction });
    }
    await f.update({ name: input.name, slug: input.slug }, { transaction });
    await AuditLog.create(
      {
        actorId: actor.id,
        action: 'feedstock.rename',
        subjectType: 'feedstock',
        subjectId: String(f.id),
        details: { from: { name: previousName, slug: previousSlug }, to: { name: input.name, slug: input.slug } },
      },
      { transaction },
    );
    return { id: f.id, slug: f.slug, name: f.name, previousSlug };
  });
}

/** What a merge moved. */
export interface MergeResult {
  source: FeedstockRef;
  target: FeedstockRef;
  moved: { trials: number; aliases: number; proposals: number; subscriptions: number; redirects: number; requests: number };
  droppedDuplicateSubscriptions: number;
  rejectedPendingEdits: number;
}

/**
 * Merges a feedstock into another (editors), in one transaction: trials,
 * aliases, proposals, subscriptions, old addresses and requests move to the
 * target; the source's name becomes an alias of the target and its address
 * redirects there; the source's pending text edits are rejected with a note;
 * both feedstocks' evidence is recomputed. Audit-logged. A subscriber of
 * both keeps one subscription (the target's).
 */
export async function mergeFeedstocks(actor: Actor, raw: unknown): Promise<MergeResult> {
  authorizeUser(actor, 'feedstock.merge');
  const input: FeedstockMergeInput = FeedstockMergeSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    // Lock both rows in id order so two merges cannot deadlock.
    const [first, second] = [input.sourceId, input.targetId].sort((a, b) => a - b);
    const a = await Feedstock.findByPk(first, { transaction, lock: transaction.LOCK.UPDATE });
    const b = await Feedstock.findByPk(second, { transaction, lock: transaction.LOCK.UPDATE });
    const source = [a, b].find((x) => x?.id === input.sourceId) ?? null;
    const target = [a, b].find((x) => x?.id === input.targetId) ?? null;
    if (!source) throw new NotFoundError('No such feedstock to merge.');
    if (!target) throw new InvalidInputError(undefined, { targetId: ['No such feedstock to merge into.'] });
    if (source.mergedIntoId) throw new ConflictError(`${source.name} was already merged.`);
    if (target.mergedIntoId) throw new InvalidInputError(undefined, { targetId: [`${target.name} was itself merged; choose the feedstock it went into.`] });

    const where = { feedstockId: source.id };
    const [trials] = await Trial.update({ feedstockId: target.id }, { where, transaction });
    const [aliases] = await FeedstockAlias.update({ feedstockId: target.id }, { where, transaction });
    const [proposals] = await Proposal.update({ feedstockId: target.id }, { where, transaction });
    const [redirects] = await FeedstockRedirect.update({ feedstockId: target.id }, { where, transaction });
    const [requests] = await FeedstockRequest.update({ feedstockId: target.id }, { where, transaction });

    // Subscriptions: one per address and feedstock (unique index), so a subscriber of both keeps the target's.
    const targetEmails = new Set(
      (await Subscription.findAll({ where: { feedstockId: target.id }, attributes: ['email'], transaction })).map((s) => s.email.toLowerCase()),
    );
    const sourceSubs = await Subscription.findAll({ where, transaction });
    const duplicates = sourceSubs.filter((s) => targetEmails.has(s.email.toLowerCase()));
    if (duplicates.length) await Subscription.destroy({ where: { id: duplicates.map((s) => s.id) }, transaction });
    const [subscriptions] = await Subscription.update({ feedstockId: target.id }, { where, transaction });

    // The source's own name keeps finding the target in search.
    const sourceName = source.name.trim().toLowerCase();
    if (sourceName !== target.name.trim().toLowerCase() && !(await FeedstockAlias.findOne({ where: { alias: sourceName }, transaction }))) {
      await FeedstockAlias.create({ feedstockId: target.id, alias: sourceName.slice(0, 160) }, { transaction });
    }
    await FeedstockRedirect.create({ oldSlug: source.slug, feedstockId: target.id }, { transaction });

    const [rejectedPendingEdits] = await FeedstockRevision.update(
      { status: 'rejected', reviewerId: actor.id, reviewedAt: new Date(), reviewNote: `This page was merged into ${target.name}; suggest the edit there.` },
      { where: { feedstockId: source.id, status: 'pending' }, transaction },
    );
    await source.update({ mergedIntoId: target.id }, { transaction });
    await recomputeFeedstock(target.id, transaction);
    await recomputeFeedstock(source.id, transaction);

    const moved = { trials, aliases, proposals, subscriptions, redirects, requests };
    await AuditLog.create(
      {
        actorId: actor.id,
        action: 'feedstock.merge',
        subjectType: 'feedstock',
        subjectId: String(source.id),
        details: { into: target.id, sourceSlug: source.slug, targetSlug: target.slug, moved, droppedDuplicateSubscriptions: duplicates.length, note: input.note },
      },
      { transaction },
    );
    return {
      source: { id: source.id, slug: source.slug, name: source.name },
      target: { id: target.id, slug: target.slug, name: target.name },
      moved,
      droppedDuplicateSubscriptions: duplicates.length,
      rejectedPendingEdits,
    };
  });
}

/**
 * Stores a request for a feedstock the site does not have. Anyone may ask,
 * signed in or not; a signed-in requester is remembered.
 */
export async function requestFeedstock(actor: Actor, raw: unknown): Promise<{ id: number; name: string }> {
  authorize(actor, 'feedstock.request');
  const input: FeedstockRequestInput = FeedstockRequestSchema.parse(raw);
  const row = await FeedstockRequest.create({ name: input.name, note: input.note || null, requesterId: actor?.id ?? null });
  return { id: row.id, name: row.name };
}

/** An editor declines or reopens a request (audit-logged). */
export async function decideFeedstockRequest(actor: Actor, raw: unknown): Promise<{ id: number; status: string }> {
  authorizeUser(actor, 'feedstock.create');
  const input = RequestDecisionSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const r = await FeedstockRequest.findByPk(input.requestId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!r) throw new NotFoundError('No such request.');
    if (r.status === 'added') throw new ConflictError('This request already has its page.');
    await r.update({ status: input.status }, { transaction });
    await AuditLog.create(
      { actorId: actor.id, action: `feedstock-request.${input.status === 'open' ? 'reopen' : 'decline'}`, subjectType: 'feedstock_request', subjectId: String(r.id), details: { name: r.name } },
      { transaction },
    );
    return { id: r.id, status: r.status };
  });
}
