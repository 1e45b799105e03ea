import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { AuditLog, Feedstock, FeedstockRevision, OutboxMessage, Subscription, User } from '@/db/models';
import { ConflictError, ForbiddenError, InvalidInputError, UnauthenticatedError } from '@/lib/errors';
import type { Actor } from '@/lib/policies';
import { listPendingEdits, listRevisionHistory } from '@/lib/queries/feedstocks';
import { reviewPageEdit, revertPageText, submitPageEdit } from '@/lib/services/revisions';
import { buildFeedstock, buildUser } from '../support/factories';

const actorOf = (u: User): Actor => ({ id: u.id, role: u.role, emailVerified: true, createdAt: u.createdAt });

// Page text: contributors suggest, editors publish and review, history keeps every version.
describe('page-text edits, review, history and revert', () => {
  let contributor: User;
  let editor: User;
  let reader: User;
  let feedstock: Feedstock;
  const users: User[] = [];

  beforeAll(async () => {
    contributor = await buildUser({ role: 'contributor' });
    editor = await buildUser({ role: 'editor' });
    reader = await buildUser({ role: 'reader' });
    users.push(contributor, editor, reader);
    feedstock = await buildFeedstock({ name: 'Test parsnip peel' });
    // The page starts with a first published revision, as created pages do.
    await FeedstockRevision.create({ feedstockId: feedstock.id, authorId: editor.id, body: feedstock.pageText, editSummary: 'First version', status: 'published', baseVersion: 0, reviewerId: editor.id, reviewedAt: new Date() });
    await Subscription.create({ feedstockId: feedstock.id, userId: reader.id, email: reader.email!, confirmedAt: new Date() });
    await Subscription.create({ feedstockId: feedstock.id, userId: null, email: 'unconfirmed@example.test' });
  });

  afterAll(async () => {
    await OutboxMessage.destroy({ where: { feedstockId: feedstock.id } });
    await AuditLog.destroy({ where: { subjectType: 'feedstock', subjectId: String(feedstock.id) } });
    await feedstock.destroy(); // revisions and subscriptions cascade
    for (const u of users) await u.destroy();
    await sequelize.close();
  });

  it('walks a contributor edit through review to a published, diffed, revertable version', async () => {
    const start = await Feedstock.findByPk(feedstock.id);
    expect(start!.version).toBe(1);

    // 1. A contributor suggests an edit: it waits, the page does not change.
    const suggested = await submitPageEdit(actorOf(contributor), feedstock.id, {
      body: 'Made by a test.\n\nChop the peel small; worms take it within a fortnight.',
      editSummary: 'Add preparation advice',
      baseVersion: 1,
    });
    expect(suggested).toMatchObject({ status: 'pending', version: 1 });
    expect((await Feedstock.findByPk(feedstock.id))!.pageText).toBe('Made by a test.');
    const queue = await listPendingEdits({ feedstockId: feedstock.id });
    expect(queue).toHaveLength(1);
    expect(queue[0]).toMatchObject({ id: suggested.revisionId, stale: false, added: 2, removed: 0 });

    // 2. An editor approves it: published as version 2, subscribers queued a mail.
    const approved = await reviewPageEdit(actorOf(editor), suggested.revisionId, { decision: 'approve', note: 'Thanks' });
    expect(approved).toMatchObject({ status: 'published', version: 2 });
    const after = await Feedstock.findByPk(feedstock.id);
    expect(after!.pageText).toContain('Chop the peel small');
    expect(after!.version).toBe(2);
    const mails = await OutboxMessage.findAll({ where: { feedstockId: feedstock.id, kind: 'page-edited' } });
    expect(mails.map((m) => m.recipient)).toEqual([reader.email]); // the unconfirmed address gets nothing
    expect(mails[0].payload).toMatchObject({ slug: feedstock.slug, revisionId: suggested.revisionId });
    expect(await listPendingEdits({ feedstockId: feedstock.id })).toHaveLength(0);

    // 3. History shows both versions, newest first, with the diff.
    const history = await listRevisionHistory(feedstock.id);
    expect(history.entries.map((e) => e.version)).toEqual([2, 1]);
    expect(history.entries[0]).toMatchObject({ isCurrent: true, editSummary: 'Add preparation advice', added: 2, removed: 0 });
    expect(history.entries[0].diff.filter((p) => p.kind === 'added').map((p) => p.value).join('')).toContain('Chop the peel small');

    // 4. The editor reverts to version 1: a new published version 3 with the old text.
    const first = history.entries[1];
    const reverted = await revertPageText(actorOf(editor), feedstock.id, { revisionId: first.id, baseVersion: 2 });
    expect(reverted).toMatchObject({ status: 'published', version: 3 });
    expect((await Feedstock.findByPk(feedstock.id))!.pageText).toBe('Made by a test.');
    const h2 = await listRevisionHistory(feedstock.id);
    expect(h2.entries.map((e) => e.version)).toEqual([3, 2, 1]);
    expect(h2.entries[0]).toMatchObject({ editSummary: 'Reverted to version 1', removed: 2, added: 0 });

    const audit = await AuditLog.findAll({ where: { subjectType: 'feedstock', subjectId: String(feedstock.id) }, order: [['id', 'ASC']] });
    expect(audit.map((a) => a.action)).toEqual(['feedstock.edit.approve', 'feedstock.revert']);
  });

  it('refuses an edit made against an older version with a 409 that says what changed, and saves nothing', async () => {
    const f = (await Feedstock.findByPk(feedstock.id))!;
    const before = await FeedstockRevision.count({ where: { feedstockId: f.id } });
    const err = await submitPageEdit(actorOf(editor), f.id, { body: 'A stale rewrite.', baseVersion: 1 }).catch((e) => e);
    expect(err).toBeInstanceOf(ConflictError);
    expect(err.status).toBe(409);
    expect(err.message).toContain(`you started from version 1, and it is now version ${f.version}`);
    expect(err.message).toContain('Add preparation advice');
    expect(await FeedstockRevision.count({ where: { feedstockId: f.id } })).toBe(before);
    expect((await Feedstock.findByPk(f.id))!.pageText).toBe(f.pageText);
  });

  it('lets editors publish directly, and refuses approval of a suggestion the page has moved past', async () => {
    const f = (await Feedstock.findByPk(feedstock.id))!;
    const suggestion = await submitPageEdit(actorOf(contributor), f.id, { body: 'Contributor text.', baseVersion: f.version });
    const direct = await submitPageEdit(actorOf(editor), f.id, { body: 'Editor text.', editSummary: 'Tidy', baseVersion: f.version });
    expect(direct).toMatchObject({ status: 'published', version: f.version + 1 });
    const stale = await listPendingEdits({ feedstockId: f.id });
    expect(stale[0]).toMatchObject({ id: suggestion.revisionId, stale: true });
    await expect(reviewPageEdit(actorOf(editor), suggestion.revisionId, { decision: 'approve' })).rejects.toBeInstanceOf(ConflictError);
    // A rejection needs a note; with one, the author is told why.
    await expect(reviewPageEdit(actorOf(editor), suggestion.revisionId, { decision: 'reject', note: '' })).rejects.toMatchObject({ name: 'ZodError' });
    const rejected = await reviewPageEdit(actorOf(editor), suggestion.revisionId, { decision: 'reject', note: 'Please redo on the new text.' });
    expect(rejected.status).toBe('rejected');
    const mail = await OutboxMessage.findOne({ where: { kind: 'edit-rejected', feedstockId: f.id } });
    expect(mail?.recipient).toBe(contributor.email);
    // Decided once, decided for good.
    await expect(reviewPageEdit(actorOf(editor), suggestion.revisionId, { decision: 'approve' })).rejects.toBeInstanceOf(ConflictError);
  });

  it('checks permissions in the service: visitors, readers and contributors get what the policy says', async () => {
    const f = (await Feedstock.findByPk(feedstock.id))!;
    const edit = { body: 'Anything.', baseVersion: f.version };
    await expect(submitPageEdit(null, f.id, edit)).rejects.toBeInstanceOf(UnauthenticatedError);
    await expect(submitPageEdit(actorOf(reader), f.id, edit)).rejects.toBeInstanceOf(ForbiddenError);
    const pending = await submitPageEdit(actorOf(contributor), f.id, edit);
    await expect(reviewPageEdit(actorOf(contributor), pending.revisionId, { decision: 'approve' })).rejects.toBeInstanceOf(ForbiddenError);
    await expect(revertPageText(actorOf(contributor), f.id, { revisionId: pending.revisionId, baseVersion: f.version })).rejects.toBeInstanceOf(ForbiddenError);
    await expect(submitPageEdit(actorOf(editor), f.id, { body: f.pageText, baseVersion: f.version })).rejects.toBeInstanceOf(InvalidInputError);
    await expect(submitPageEdit(actorOf(editor), f.id, { body: '   ', baseVersion: f.version })).rejects.toMatchObject({ name: 'ZodError' });
  });
});
