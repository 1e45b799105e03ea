import 'server-only';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { execWrite, sequelize } from '@/db';
import {
  AuditLog,
  Feedstock,
  Proposal,
  ProposalTrial,
  PublishedVerdict,
  Trial,
  VerdictHistory,
  Vote,
} from '@/db/models';
import { tallyVotes, type Tally } from '@/lib/consensus';
import { ConflictError, ForbiddenError, InvalidInputError, NotFoundError } from '@/lib/errors';
import { authorizeUser, type Actor } from '@/lib/policies';
import {
  DecisionSchema,
  HideSchema,
  ProposalCreateSchema,
  VoteSchema,
  type ProposalCreateInput,
} from '@/lib/validation/proposals';
import { SETTING_PLURALS, VERDICT_LABELS } from '@/lib/vocabulary';
import { queueFeedstockEvent } from './notifications';


/**
 * Opens a verdict proposal (contributors and up) against the feedstock's
 * current published verdict, citing trials of that feedstock. Subscribers are
 * told through the outbox in the same transaction.
 */
export async function createProposal(actor: Actor, raw: unknown): Promise<{ id: number }> {
  authorizeUser(actor, 'proposal.create');
  const input: ProposalCreateInput = ProposalCreateSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const feedstock = await Feedstock.findByPk(input.feedstockId, { transaction });
    if (!feedstock || feedstock.mergedIntoId) throw new InvalidInputError(undefined, { feedstockId: ['No such feedstock.'] });
    const trialIds = [...new Set(input.trialIds)];
    if (trialIds.length) {
      const found = await Trial.count({ where: { id: trialIds, feedstockId: feedstock.id }, transaction });
      if (found !== trialIds.length) throw new InvalidInputError(undefined, { trialIds: ['Cite only trials of this feedstock.'] });
    }
    const proposal = await Proposal.create(
      {
        feedstockId: feedstock.id,
        authorId: actor.id,
        baseVerdictVersion: feedstock.verdictVersion,
        settings: input.settings,
        rationale: input.rationale,
      },
      { transaction },
    );
    if (trialIds.length) await ProposalTrial.bulkCreate(trialIds.map((trialId) => ({ proposalId: proposal.id, trialId })), { transaction });
    await queueFeedstockEvent(transaction, {
      kind: 'proposal-opened',
      eventId: `proposal-${proposal.id}`,
      feedstockId: feedstock.id,
      payload: {
        proposalId: proposal.id,
        feedstockSlug: feedstock.slug,
        feedstockName: feedstock.name,
        summary: input.settings.map((s) => `${VERDICT_LABELS[s.verdict]} in ${SETTING_PLURALS[s.setting]}`).join('; '),
        trialCount: trialIds.length,
      },
    });
    return { id: proposal.id };
  });
}

/** Counts the visible votes of a proposal and applies the consensus rule. */
export async function getTally(proposalId: number, transaction?: Transaction): Promise<Tally> {
  const rows = await sequelize.query<{ agree: number; n: number }>(
    'SELECT agree, COUNT(*) AS n FROM votes WHERE proposal_id = ? AND hidden_at IS NULL GROUP BY agree',
    { replacements: [proposalId], type: QueryTypes.SELECT, transaction },
  );
  let agree = 0;
  let disagree = 0;
  for (const r of rows) {
    if (Number(r.agree)) agree = Number(r.n);
    else disagree = Number(r.n);
  }
  return tallyVotes(agree, disagree);
}

/**
 * Casts or changes the actor's vote. One vote per person per proposal is held
 * by a unique key: a double submit updates the same row. Votes freeze when the
 * proposal is decided; nobody votes on their own proposal.
 */
export async function castVote(actor: Actor, proposalId: number, raw: unknown): Promise<Tally> {
  const input = VoteSchema.parse(raw);
  const proposal = await Proposal.findByPk(proposalId);
  if (!proposal || proposal.hiddenAt) throw new NotFoundError('No such proposal.');
  authorizeUser(actor, 'proposal.vote', { authorId: proposal.authorId });
  if (proposal.status !== 'open') throw new ConflictError('This proposal has been decided; votes are frozen.');
  // INSERT … ON DUPLICATE KEY UPDATE: atomic under concurrent double submits.
  await sequelize.query(
    `INSERT INTO votes (proposal_id, voter_id, agree, reason, created_at, updated_at)
     SELECT ?, ?, ?, ?, UTC_TIMESTAMP(3), UTC_TIMESTAMP(3) FROM proposals WHERE id = ? AND status = 'open'
     ON DUPLICATE KEY UPDATE agree = VALUES(agree), reason = VALUES(reason), updated_at = VALUES(updated_at)`,
    { replacements: [proposalId, actor.id, input.agree, input.reason, proposalId] },
  );
  return getTally(proposalId);
}

/** A claim on a review item: one reviewer at a time, for CLAIM_MINUTES. */
export const CLAIM_MINUTES = 30;

/** Claims a proposal for review so two moderators do not decide it at once. */
export async function claimProposal(actor: Actor, proposalId: number): Promise<{ claimedUntil: Date }> {
  authorizeUser(actor, 'proposal.claim');
  const until = new Date(Date.now() + CLAIM_MINUTES * 60_000);
  const changed = await execWrite(
    `UPDATE proposals SET claimed_by = ?, claimed_until = ?, updated_at = UTC_TIMESTAMP(3)
     WHERE id = ? AND status = 'open' AND (claimed_by IS NULL OR claimed_by = ? OR claimed_until < UTC_TIMESTAMP(3))`,
    { replacements: [actor.id, until, proposalId, actor.id] },
  );
  if (!changed) throw new ConflictError('Another reviewer has claimed this proposal for now.');
  return { claimedUntil: until };
}

/** Test seam: called between the steps of an approval (fault and race tests). */
export type ApprovalHook = (step: 'locked' | 'published' | 'history' | 'outbox', transaction: Transaction) => Promise<void>;

/**
 * A moderator approves or rejects a proposal with a written note. Approval
 * publishes the proposed verdicts in ONE transaction guarded by the feedstock's
 * verdict_version: a proposal made against an older published verdict gets a
 * 409 that names what changed since, never a lost update. History, proposal
 * state, outbox rows and the audit entry commit together or not at all.
 */
export async function decideProposal(
  actor: Actor,
  proposalId: number,
  raw: unknown,
  hook?: ApprovalHook,
): Promise<{ status: 'approved' | 'rejected'; verdictVersion: number }> {
  authorizeUser(actor, 'proposal.decide');
  const input = DecisionSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const proposal = await Proposal.findByPk(proposalId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!proposal) throw new NotFoundError('No such proposal.');
    if (proposal.status !== 'open') throw new ConflictError(`This proposal was already ${proposal.status}.`);
    if (proposal.claimedBy && proposal.claimedBy !== actor.id && proposal.claimedUntil && proposal.claimedUntil > new Date()) {
      throw new ConflictError('Another reviewer has claimed this proposal; wait for the claim to lapse.');
    }
    const feedstock = await Feedstock.findByPk(proposal.feedstockId, { transaction });
    if (!feedstock) throw new NotFoundError('The feedstock is gone.');
    await hook?.('locked', transaction);
    const now = new Date();

    if (input.decision === 'reject') {
      await proposal.update({ status: 'rejected', decidedBy: actor.id, decidedAt: now, decisionNote: input.note, version: proposal.version + 1 }, { transaction });
      await AuditLog.create(
        { actorId: actor.id, action: 'proposal.reject', subjectType: 'proposal', subjectId: String(proposal.id), details: { note: input.note } },
        { transaction },
      );
      await queueFeedstockEvent(transaction, {
        kind: 'verdict-decided',
        eventId: `proposal-${proposal.id}-decided`,
        feedstockId: feedstock.id,
        payload: { proposalId: proposal.id, feedstockSlug: feedstock.slug, feedstockName: feedstock.name, decision: 'rejected', note: input.note },
      });
      return { status: 'rejected' as const, verdictVersion: feedstock.verdictVersion };
    }

    // Optimistic lock: publish only if nothing was published since the proposal was made.
    const changed = await execWrite(
      'UPDATE feedstocks SET verdict_version = verdict_version + 1, updated_at = UTC_TIMESTAMP(3) WHERE id = ? AND verdict_version = ?',
      { replacements: [feedstock.id, proposal.baseVerdictVersion], transaction },
    );
    if (!changed) {
      const since = await VerdictHistory.findAll({
        where: { feedstockId: feedstock.id, decidedAt: { [Op.gte]: proposal.createdAt } },
        order: [['decidedAt', 'ASC']],
        transaction,
      });
      const what = since.length
        ? since.map((h) => `${VERDICT_LABELS[h.verdict]} in ${SETTING_PLURALS[h.setting]} (proposal ${h.proposalId ?? '—'}, ${h.decidedAt.toISOString().slice(0, 10)})`).join('; ')
        : 'the published verdict';
      throw new ConflictError(
        `The published verdict changed after this proposal was made: ${what}. Revise the proposal against the current verdict and resubmit.`,
      );
    }

    const previous = await PublishedVerdict.findAll({ where: { feedstockId: feedstock.id }, transaction });
    const prevBySetting = new Map(previous.map((p) => [p.setting, p]));
    // The replaced verdicts, read before the rows are updated (history and mail need the old value).
    const replaced = new Map(previous.map((p) => [p.setting, p.verdict]));
    for (const s of proposal.settings) {
      const prev = prevBySetting.get(s.setting);
      if (prev) {
        await prev.update({ verdict: s.verdict, ceilingKgM2: s.ceilingKgM2, cautions: s.cautions, proposalId: proposal.id, publishedAt: now }, { transaction });
      } else {
        await PublishedVerdict.create(
          { feedstockId: feedstock.id, setting: s.setting, verdict: s.verdict, ceilingKgM2: s.ceilingKgM2, cautions: s.cautions, proposalId: proposal.id, publishedAt: now },
          { transaction },
        );
      }
    }
    await hook?.('published', transaction);
    await VerdictHistory.bulkCreate(
      proposal.settings.map((s) => ({
        feedstockId: feedstock.id,
        setting: s.setting,
        previousVerdict: replaced.get(s.setting) ?? null,
        verdict: s.verdict,
        ceilingKgM2: s.ceilingKgM2,
        cautions: s.cautions,
        proposalId: proposal.id,
        decidedBy: actor.id,
        note: input.note,
        decidedAt: now,
      })),
      { transaction },
    );
    await proposal.update({ status: 'approved', decidedBy: actor.id, decidedAt: now, decisionNote: input.note, version: proposal.version + 1 }, { transaction });
    await hook?.('history', transaction);
    const cited = await ProposalTrial.count({ where: { proposalId: proposal.id }, transaction });
    const changes = proposal.settings.map((s) => {
      const from = replaced.get(s.setting);
      return `${from ? `${VERDICT_LABELS[from]} → ` : ''}${VERDICT_LABELS[s.verdict]} in ${SETTING_PLURALS[s.setting]}`;
    });
    await queueFeedstockEvent(transaction, {
      kind: 'verdict-decided',
      eventId: `proposal-${proposal.id}-decided`,
      feedstockId: feedstock.id,
      payload: {
        proposalId: proposal.id,
        feedstockSlug: feedstock.slug,
        feedstockName: feedstock.name,
        decision: 'approved',
        note: input.note,
        summary: `${changes.join('; ')}, after proposal ${proposal.id}${cited ? ` citing ${cited} trial${cited === 1 ? '' : 's'}` : ''}`,
      },
    });
    await hook?.('outbox', transaction);
    await AuditLog.create(
      { actorId: actor.id, action: 'proposal.approve', subjectType: 'proposal', subjectId: String(proposal.id), details: { note: input.note, settings: proposal.settings } },
      { transaction },
    );
    return { status: 'approved' as const, verdictVersion: feedstock.verdictVersion + 1 };
  });
}

/**
 * Turns the author's rejected (or stale) proposal into a new open proposal
 * against the current published verdict, optionally revised.
 */
export async function resubmitProposal(actor: Actor, proposalId: number, raw: unknown = {}): Promise<{ id: number }> {
  const old = await Proposal.findByPk(proposalId, { include: [{ model: Trial, as: 'trials', attributes: ['id'] }] });
  if (!old) throw new NotFoundError('No such proposal.');
  authorizeUser(actor, 'proposal.create');
  if (old.authorId !== actor.id) throw new ForbiddenError('Only the author can resubmit a proposal.');
  if (old.status === 'approved') throw new ConflictError('This proposal was approved; open a new one instead.');
  const cited = ((old as unknown as { trials?: { id: number }[] }).trials ?? []).map((t) => t.id);
  // Only the parts an author may revise; the feedstock stays the same.
  const changes = (raw && typeof raw === 'object' ? raw : {}) as Record<string, unknown>;
  const revised = {
    feedstockId: old.feedstockId,
    settings: changes.settings ?? old.settings,
    rationale: changes.rationale ?? old.rationale,
    trialIds: changes.trialIds ?? cited,
  };
  return createProposal(actor, revised);
}

/** Moderators hide or restore an abusive proposal; written to the audit log. */
export async function setProposalHidden(actor: Actor, proposalId: number, raw: unknown): Promise<void> {
  authorizeUser(actor, 'moderation.hide');
  const input = HideSchema.parse(raw);
  await sequelize.transaction(async (transaction) => {
    const p = await Proposal.findByPk(proposalId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!p) throw new NotFoundError('No such proposal.');
    await p.update({ hiddenAt: input.hidden ? new Date() : null, hiddenBy: input.hidden ? actor.id : null }, { transaction });
    await AuditLog.create(
      { actorId: actor.id, action: input.hidden ? 'proposal.hide' : 'proposal.restore', subjectType: 'proposal', subjectId: String(p.id), details: { reason: input.reason } },
      { transaction },
    );
  });
}

/** Moderators hide or restore an abusive vote comment; written to the audit log. */
export async function setVoteHidden(actor: Actor, voteId: number, raw: unknown): Promise<void> {
  authorizeUser(actor, 'moderation.hide');
  const input = HideSchema.parse(raw);
  await sequelize.transaction(async (transaction) => {
    const v = await Vote.findByPk(voteId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!v) throw new NotFoundError('No such vote.');
    await v.update({ hiddenAt: input.hidden ? new Date() : null, hiddenBy: input.hidden ? actor.id : null }, { transaction });
    await AuditLog.create(
      { actorId: actor.id, action: input.hidden ? 'vote.hide' : 'vote.restore', subjectType: 'vote', subjectId: String(v.id), details: { reason: input.reason, proposalId: v.proposalId } },
      { transaction },
    );
  });
}
