import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { sequelize } from '@/db';
import { AuditLog, Feedstock, FeedstockRevision, OutboxMessage, User } from '@/db/models';
import { ConflictError, InvalidInputError, NotFoundError } from '@/lib/errors';
import { authorizeUser, can, type Actor } from '@/lib/policies';
import { diffText } from '@/lib/text-diff';
import { queueFeedstockEvent } from './notifications';
import {
  EditReviewSchema,
  PageEditSchema,
  RevertSchema,
  type EditReviewInput,
  type PageEditInput,
  type RevertInput,
} from '@/lib/validation/feedstocks';

/** What a page-text write returns. */
export interface RevisionResult {
  revisionId: number;
  feedstockId: number;
  slug: string;
  status: 'published' | 'pending' | 'rejected';
  /** The feedstock's text version after the write. */
  version: number;
}

async function lockFeedstock(id: number, transaction: Transaction): Promise<Feedstock> {
  const f = await Feedstock.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
  if (!f || f.mergedIntoId) throw new NotFoundError('No such feedstock.');
  return f;
}

/**
 * Explains a text conflict: which published edits came after the version the
 * writer started from, by whom, and how many lines each changed.
 */
async function conflictMessage(f: Feedstock, baseVersion: number, transaction: Transaction): Promise<string> {
  const later = await FeedstockRevision.findAll({
    where: { feedstockId: f.id, status: 'published', baseVersion: { [Op.gte]: baseVersion } },
    order: [['baseVersion', 'ASC'], ['id', 'ASC']],
    include: [{ model: User, as: 'author', attributes: ['name'] }],
    transaction,
  });
  const before = await FeedstockRevision.findOne({
    where: { feedstockId: f.id, status: 'published', baseVersion: { [Op.lt]: baseVersion } },
    order: [['baseVersion', 'DESC'], ['id', 'DESC']],
    transaction,
  });
  let previous = before?.body ?? '';
  const lines = later.map((r) => {
    const d = diffText(previous, r.body);
    previous = r.body;
    const who = (r as unknown as { author?: User | null }).author?.name ?? 'someone';
    const what = r.editSummary ? `“${r.editSummary}”` : 'no summary';
    return `version ${r.baseVersion + 1} by ${who} (${what}; +${d.added} −${d.removed} lines)`;
  });
  const n = later.length;
  return (
    `The page text changed while you were editing: you started from version ${baseVersion}, and it is now version ${f.version}. ` +
    (n ? `${n === 1 ? 'One edit was' : `${n} edits were`} published since: ${lines.join('; ')}. ` : '') +
    'Your text was not saved. Copy it, reload the page, and apply your change to the current text.'
  );
}

/** Queues a "page edited" mail for each follower of the feedstock or the whole site (same transaction). */
async function queuePageEditedMail(f: Feedstock, revision: FeedstockRevision, transaction: Transaction): Promise<number> {
  return queueFeedstockEvent(transaction, {
    kind: 'page-edited',
    eventId: `revision-${revision.id}`,
    feedstockId: f.id,
    payload: {
      feedstockId: f.id,
      slug: f.slug,
      name: f.name,
      revisionId: revision.id,
      version: f.version,
      editSummary: revision.editSummary,
      change: `The page text of ${f.name} was edited${revision.editSummary ? `: ${revision.editSummary}` : ''}.`,
      path: `/feedstocks/${f.slug}/history`,
    },
  });
}

async function publish(
  f: Feedstock,
  revision: FeedstockRevision,
  actor: NonNullable<Actor>,
  action: string,
  details: Record<string, unknown>,
  transaction: Transaction,
): Promise<void> {
  await f.update({ pageText: revision.body, version: f.version + 1 }, { transaction });
  const mails = await queuePageEditedMail(f, revision, transaction);
  await AuditLog.create(
    { actorId: actor.id, action, subjectType: 'feedstock', subjectId: String(f.id), details: { revisionId: revision.id, version: f.version, mails, ...details } },
    { transaction },
  );
}

/**
 * Saves an edit of a feedstock's page text. Editors publish directly; a
 * contributor's edit waits for review. The edit names the text version it
 * was made against: if the page changed since, nothing is saved and a
 * ConflictError (409) says what changed. Throws UnauthenticatedError /
 * ForbiddenError below contributor, InvalidInputError for bad input or an
 * unchanged text, NotFoundError for an unknown or merged feedstock.
 */
export async function submitPageEdit(actor: Actor, feedstockId: number, raw: unknown): Promise<RevisionResult> {
  authorizeUser(actor, 'feedstock.suggest-edit');
  const input: PageEditInput = PageEditSchema.parse(raw);
  const direct = can(actor, 'feedstock.edit');
  return sequelize.transaction(async (transaction) => {
    const f = await lockFeedstock(feedstockId, transaction);
    if (input.baseVersion !== f.version) throw new ConflictError(await conflictMessage(f, input.baseVersion, transaction));
    if (input.body === f.pageText) throw new InvalidInputError('Nothing changed.', { body: ['The text is the same as the current page.'] });
    const revision = await FeedstockRevision.create(
      {
        feedstockId: f.id,
        authorId: actor.id,
        body: input.body,
        editSummary: input.editSummary,
        status: direct ? 'published' : 'pending',
        baseVersion: f.version,
        ...(direct ? { reviewerId: actor.id, reviewedAt: new Date() } : {}),
      },
      { transaction },
    );
    if (direct) await publish(f, revision, actor, 'feedstock.edit', { direct: true }, transaction);
    return { revisionId: revision.id, feedstockId: f.id, slug: f.slug, status: revision.status, version: f.version };
  });
}

/**
 * An editor approves or rejects a suggested edit (a rejection carries a note
 * that is mailed to the author). Approving publishes it as the next version;
 * if the page changed after the edit was suggested, approval is refused with
 * a ConflictError (reject it with a note asking for a redo instead). A
 * decided edit cannot be decided again (ConflictError).
 */
export async function reviewPageEdit(actor: Actor, revisionId: number, raw: unknown): Promise<RevisionResult> {
  authorizeUser(actor, 'feedstock.review-edit');
  const input: EditReviewInput = EditReviewSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const found = await FeedstockRevision.findByPk(revisionId, { transaction });
    if (!found) throw new NotFoundError('No such edit.');
    // Lock in the same order as edits do (feedstock, then revision) so the two cannot deadlock.
    const f = await lockFeedstock(found.feedstockId, transaction);
    const revision = (await FeedstockRevision.findByPk(revisionId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    if (revision.status !== 'pending') throw new ConflictError(`This edit was already ${revision.status === 'published' ? 'approved' : 'rejected'}.`);
    const decided = { reviewerId: actor.id, reviewedAt: new Date(), reviewNote: input.note || null };
    if (input.decision === 'reject') {
      await revision.update({ status: 'rejected', ...decided }, { transaction });
      const author = revision.authorId ? await User.findByPk(revision.authorId, { attributes: ['id', 'email'], transaction }) : null;
      if (author?.email) {
        await OutboxMessage.create(
          {
            kind: 'edit-rejected',
            recipient: author.email,
            subscriptionId: null,
            feedstockId: f.id,
            payload: { feedstockId: f.id, slug: f.slug, name: f.name, revisionId: revision.id, note: input.note, path: `/feedstocks/${f.slug}/edit` },
            dedupeKey: `edit-rejected:${revision.id}`,
          },
          { transaction },
        );
      }
      await AuditLog.create(
        { actorId: actor.id, action: 'feedstock.edit.reject', subjectType: 'feedstock', subjectId: String(f.id), details: { revisionId: revision.id, note: input.note } },
        { transaction },
      );
      return { revisionId: revision.id, feedstockId: f.id, slug: f.slug, status: 'rejected' as const, version: f.version };
    }
    if (revision.baseVersion !== f.version) {
      throw new ConflictError(
        `${await conflictMessage(f, revision.baseVersion, transaction)} (For a suggested edit: reject it with a note asking the author to redo it on the current text.)`,
      );
    }
    await revision.update({ status: 'published', ...decided }, { transaction });
    await publish(f, revision, actor, 'feedstock.edit.approve', { authorId: revision.authorId, note: input.note }, transaction);
    return { revisionId: revision.id, feedstockId: f.id, slug: f.slug, status: 'published' as const, version: f.version };
  });
}

/**
 * An editor puts an earlier published text back. The revert is a new
 * published revision (history is never rewritten), checked against the text
 * version the editor saw (ConflictError when the page changed since).
 */
export async function revertPageText(actor: Actor, feedstockId: number, raw: unknown): Promise<RevisionResult> {
  authorizeUser(actor, 'feedstock.edit');
  const input: RevertInput = RevertSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const f = await lockFeedstock(feedstockId, transaction);
    if (input.baseVersion !== f.version) throw new ConflictError(await conflictMessage(f, input.baseVersion, transaction));
    const old = await FeedstockRevision.findOne({ where: { id: input.revisionId, feedstockId: f.id, status: 'published' }, transaction });
    if (!old) throw new InvalidInputError(undefined, { revisionId: ['No such published revision of this page.'] });
    if (old.body === f.pageText) throw new InvalidInputError('Nothing to revert.', { revisionId: ['That revision is the current text.'] });
    const revision = await FeedstockRevision.create(
      {
        feedstockId: f.id,
        authorId: actor.id,
        body: old.body,
        editSummary: (input.editSummary || `Reverted to version ${old.baseVersion + 1}`).slice(0, 255),
        status: 'published',
        baseVersion: f.version,
        reviewerId: actor.id,
        reviewedAt: new Date(),
      },
      { transaction },
    );
    await publish(f, revision, actor, 'feedstock.revert', { revertedTo: old.id }, transaction);
    return { revisionId: revision.id, feedstockId: f.id, slug: f.slug, status: 'published' as const, version: f.version };
  });
}
