import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { sequelize } from '@/db';
import {
  AuditLog,
  EvidenceVerdict,
  Feedstock,
  FeedstockAlias,
  FeedstockRedirect,
  FeedstockRequest,
  FeedstockRevision,
  Proposal,
  Subscription,
  Trial,
  User,
} from '@/db/models';
import { ForbiddenError, InvalidInputError, UnauthenticatedError } from '@/lib/errors';
import type { Actor } from '@/lib/policies';
import { resolveFeedstockSlug } from '@/lib/queries/feedstocks';
import { createFeedstock, decideFeedstockRequest, mergeFeedstocks, renameFeedstock, requestFeedstock } from '@/lib/services/feedstocks';
import { submitPageEdit } from '@/lib/services/revisions';
import { createTrial } from '@/lib/services/trials';
import { buildProposal, buildUser } from '../support/factories';

const actorOf = (u: User): Actor => ({ id: u.id, role: u.role, emailVerified: true, createdAt: u.createdAt });
const suffix = Math.random().toString(36).slice(2, 8);

describe('feedstock create, rename, merge and requests', () => {
  let editor: User;
  let contributor: User;
  const created: number[] = [];

  beforeAll(async () => {
    editor = await buildUser({ role: 'editor' });
    contributor = await buildUser({ role: 'contributor' });
  });

  afterAll(async () => {
    await Trial.destroy({ where: { feedstockId: { [Op.in]: created } } });
    await Proposal.destroy({ where: { feedstockId: { [Op.in]: created } } });
    await AuditLog.destroy({ where: { actorId: { [Op.in]: [editor.id, contributor.id] } } });
    await FeedstockRequest.destroy({ where: { name: { [Op.like]: `%${suffix}%` } } });
    await Feedstock.update({ mergedIntoId: null }, { where: { id: { [Op.in]: created } } });
    await Feedstock.destroy({ where: { id: { [Op.in]: created } } });
    await editor.destroy();
    await contributor.destroy();
    await sequelize.close();
  });

  it('creates a feedstock with aliases and a first revision, for editors only', async () => {
    const input = { name: `Spent hops ${suffix}`, category: 'other', family: 'brewing', aliases: `used hops ${suffix}, hop waste ${suffix}`, pageText: 'Hops after brewing.', handlingCautions: ['mould'] };
    await expect(createFeedstock(actorOf(contributor), input)).rejects.toBeInstanceOf(ForbiddenError);
    await expect(createFeedstock(null, input)).rejects.toBeInstanceOf(UnauthenticatedError);
    const f = await createFeedstock(actorOf(editor), input);
    created.push(f.id);
    expect(f.slug).toBe(`spent-hops-${suffix}`);
    expect((await FeedstockAlias.findAll({ where: { feedstockId: f.id } })).map((a) => a.alias).sort()).toEqual([`hop waste ${suffix}`, `used hops ${suffix}`]);
    expect(await FeedstockRevision.count({ where: { feedstockId: f.id, status: 'published' } })).toBe(1);
    expect(await AuditLog.count({ where: { action: 'feedstock.create', subjectId: String(f.id) } })).toBe(1);
    // The address and the other names are taken now.
    const again = await createFeedstock(actorOf(editor), { ...input, aliases: '' }).catch((e) => e);
    expect(again).toBeInstanceOf(InvalidInputError);
    expect(again.fieldErrors.slug[0]).toContain('already used');
    const alias = await createFeedstock(actorOf(editor), { ...input, name: `Other ${suffix}`, aliases: `used hops ${suffix}` }).catch((e) => e);
    expect(alias.fieldErrors.aliases[0]).toContain(`used hops ${suffix}`);
  });

  it('renames a feedstock; the old address redirects to the new one', async () => {
    const f = await createFeedstock(actorOf(editor), { name: `Kale stalks ${suffix}`, category: 'vegetable' });
    created.push(f.id);
    const renamed = await renameFeedstock(actorOf(editor), f.id, { name: `Kale stems ${suffix}`, slug: `kale-stems-${suffix}` });
    expect(renamed).toMatchObject({ previousSlug: `kale-stalks-${suffix}`, slug: `kale-stems-${suffix}` });
    expect(await resolveFeedstockSlug(`kale-stalks-${suffix}`)).toEqual({ kind: 'redirect', slug: `kale-stems-${suffix}` });
    expect(await resolveFeedstockSlug(`kale-stems-${suffix}`)).toMatchObject({ kind: 'found', id: f.id });
    // Renaming back reuses the old address and drops its redirect.
    await renameFeedstock(actorOf(editor), f.id, { name: `Kale stalks ${suffix}`, slug: `kale-stalks-${suffix}` });
    expect(await resolveFeedstockSlug(`kale-stalks-${suffix}`)).toMatchObject({ kind: 'found', id: f.id });
    expect(await resolveFeedstockSlug(`kale-stems-${suffix}`)).toEqual({ kind: 'redirect', slug: `kale-stalks-${suffix}` });
    // Another feedstock's address is refused with a field message.
    const other = await createFeedstock(actorOf(editor), { name: `Chard stems ${suffix}`, category: 'vegetable' });
    created.push(other.id);
    const clash = await renameFeedstock(actorOf(editor), other.id, { name: 'Chard', slug: `kale-stems-${suffix}` }).catch((e) => e);
    expect(clash).toBeInstanceOf(InvalidInputError);
    expect(clash.fieldErrors.slug[0]).toContain('old address');
    await expect(renameFeedstock(actorOf(contributor), f.id, { name: 'x y', slug: 'x-y' })).rejects.toBeInstanceOf(ForbiddenError);
  });

  it('merges trials, aliases, proposals and subscriptions into the target in one transaction; the source redirects', async () => {
    const source = await createFeedstock(actorOf(editor), { name: `Satsuma skins ${suffix}`, category: 'fruit', aliases: `satsuma rind ${suffix}` });
    const target = await createFeedstock(actorOf(editor), { name: `Mandarin peel ${suffix}`, category: 'fruit' });
    created.push(source.id, target.id);
    const trial = await createTrial(actorOf(contributor), {
      feedstockId: source.id, setting: 'bin', preparation: 'chopped', provenance: 'home-grown',
      surfaceArea: { amount: 0.25, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 0.2, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-01',
    });
    const proposal = await buildProposal((await Feedstock.findByPk(source.id))!, contributor);
    await Subscription.bulkCreate([
      { feedstockId: source.id, email: `both-${suffix}@example.test`, confirmedAt: new Date() },
      { feedstockId: source.id, email: `source-only-${suffix}@example.test`, confirmedAt: new Date() },
      { feedstockId: target.id, email: `both-${suffix}@example.test`, confirmedAt: new Date() },
    ]);
    const pending = await submitPageEdit(actorOf(contributor), source.id, { body: 'A suggestion.', baseVersion: 1 });
    expect(await EvidenceVerdict.count({ where: { feedstockId: source.id } })).toBe(1);

    await expect(mergeFeedstocks(actorOf(contributor), { sourceId: source.id, targetId: target.id })).rejects.toBeInstanceOf(ForbiddenError);
    const result = await mergeFeedstocks(actorOf(editor), { sourceId: source.id, targetId: target.id, note: 'Same thing' });
    expect(result.moved).toMatchObject({ trials: 1, aliases: 1, proposals: 1, subscriptions: 1 });
    expect(result.droppedDuplicateSubscriptions).toBe(1);
    expect(result.rejectedPendingEdits).toBe(1);

    expect((await Trial.findByPk(trial.id))!.feedstockId).toBe(target.id);
    expect((await Proposal.findByPk(proposal.id))!.feedstockId).toBe(target.id);
    const aliases = (await FeedstockAlias.findAll({ where: { feedstockId: target.id } })).map((a) => a.alias).sort();
    expect(aliases).toEqual([`satsuma rind ${suffix}`, `satsuma skins ${suffix}`]);
    expect((await Subscription.findAll({ where: { feedstockId: target.id } })).map((s) => s.email).sort()).toEqual([`both-${suffix}@example.test`, `source-only-${suffix}@example.test`]);
    expect(await Subscription.count({ where: { feedstockId: source.id } })).toBe(0);
    expect((await FeedstockRevision.findByPk(pending.revisionId))!.status).toBe('rejected');
    // Evidence follows the trials.
    expect(await EvidenceVerdict.count({ where: { feedstockId: source.id } })).toBe(0);
    expect(await EvidenceVerdict.count({ where: { feedstockId: target.id } })).toBe(1);
    // The source's page address leads to the target, and nothing is left pointing at the source.
    expect(await resolveFeedstockSlug(source.slug)).toEqual({ kind: 'redirect', slug: target.slug });
    expect(await FeedstockRedirect.count({ where: { feedstockId: source.id } })).toBe(0);
    expect(await AuditLog.count({ where: { action: 'feedstock.merge', subjectId: String(source.id) } })).toBe(1);
    // A second merge of the same source is refused; nothing moves.
    await expect(mergeFeedstocks(actorOf(editor), { sourceId: source.id, targetId: target.id })).rejects.toMatchObject({ status: 409 });
    await expect(mergeFeedstocks(actorOf(editor), { sourceId: target.id, targetId: target.id })).rejects.toMatchObject({ name: 'ZodError' });
  });

  it('keeps a merge all-or-nothing: a failure half-way leaves everything where it was', async () => {
    const source = await createFeedstock(actorOf(editor), { name: `Lime zest ${suffix}`, category: 'fruit' });
    const target = await createFeedstock(actorOf(editor), { name: `Lime peel ${suffix}`, category: 'fruit' });
    created.push(source.id, target.id);
    const trial = await createTrial(actorOf(contributor), {
      feedstockId: source.id, setting: 'bed', preparation: 'raw', provenance: 'home-grown',
      surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 1, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-01',
    });
    // A redirect row already using the source's address makes the final insert fail.
    await FeedstockRedirect.create({ oldSlug: source.slug, feedstockId: source.id });
    await expect(mergeFeedstocks(actorOf(editor), { sourceId: source.id, targetId: target.id })).rejects.toThrow();
    expect((await Trial.findByPk(trial.id))!.feedstockId).toBe(source.id);
    expect((await Feedstock.findByPk(source.id))!.mergedIntoId).toBeNull();
    await FeedstockRedirect.destroy({ where: { oldSlug: source.slug } });
  });

  it('takes a request from anyone, and lets editors decline it', async () => {
    const anon = await requestFeedstock(null, { name: `Kombucha scoby ${suffix}`, note: 'Acidic and rubbery.' });
    const signed = await requestFeedstock(actorOf(contributor), { name: `Seaweed ${suffix}` });
    expect((await FeedstockRequest.findByPk(anon.id))!.requesterId).toBeNull();
    expect((await FeedstockRequest.findByPk(signed.id))!.requesterId).toBe(contributor.id);
    await expect(requestFeedstock(null, { name: 'x' })).rejects.toMatchObject({ name: 'ZodError' });
    await expect(decideFeedstockRequest(actorOf(contributor), { requestId: anon.id, status: 'declined' })).rejects.toBeInstanceOf(ForbiddenError);
    expect(await decideFeedstockRequest(actorOf(editor), { requestId: anon.id, status: 'declined' })).toMatchObject({ status: 'declined' });
    // Creating the feedstock from the request marks it added.
    const f = await createFeedstock(actorOf(editor), { name: `Seaweed ${suffix}`, category: 'other', requestId: signed.id });
    created.push(f.id);
    expect((await FeedstockRequest.findByPk(signed.id))!).toMatchObject({ status: 'added', feedstockId: f.id });
  });
});
