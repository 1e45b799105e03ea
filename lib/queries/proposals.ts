import 'server-only';
import { Op, QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import {
  EvidenceVerdict,
  Feedstock,
  FeedstockRequest,
  FeedstockRevision,
  Proposal,
  ProposalTrial,
  PublishedVerdict,
  Trial,
  User,
  VerdictHistory,
  Vote,
} from '@/db/models';
import type { ProposedSetting } from '@/db/models/Proposal';
import { tallyVotes, type Tally } from '@/lib/consensus';
import type { TrialTableRow } from './feedstocks';
import { can, type Actor } from '@/lib/policies';
import { SETTING_PLURALS, VERDICT_LABELS } from '@/lib/vocabulary';

/** A vote as shown on a proposal page (hidden votes only to moderators). */
export interface VoteDTO {
  id: number;
  voterName: string;
  agree: boolean;
  reason: string;
  hidden: boolean;
  updatedAt: string;
}

/** A proposal page's data. */
export interface ProposalDTO {
  id: number;
  feedstock: { id: number; slug: string; name: string };
  authorName: string;
  authorId: string;
  status: 'open' | 'approved' | 'rejected' | 'withdrawn';
  hidden: boolean;
  settings: ProposedSetting[];
  current: { setting: string; verdict: string; ceilingKgM2: number | null }[];
  stale: boolean;
  rationale: string;
  trials: TrialTableRow[];
  tally: Tally;
  votes: VoteDTO[];
  myVote: { agree: boolean; reason: string } | null;
  decision: { by: string | null; at: string; note: string | null } | null;
  claim: { by: string; until: string } | null;
  createdAt: string;
  isDemo: boolean;
}

const displayName = (u: { name: string | null } | null | undefined) => u?.name?.trim() || 'A contributor';

/**
 * Loads one proposal for a viewer. Hidden proposals are visible only to
 * moderators (null for everyone else); hidden votes are withheld likewise.
 */
export async function getProposal(id: number, viewer: Actor): Promise<ProposalDTO | null> {
  const p = await Proposal.findByPk(id);
  if (!p) return null;
  const moderator = can(viewer, 'moderation.hide');
  if (p.hiddenAt && !moderator && viewer?.id !== p.authorId) return null;
  const [feedstock, author, links, votes, published, decider, claimer] = await Promise.all([
    Feedstock.findByPk(p.feedstockId, { attributes: ['id', 'slug', 'name', 'verdictVersion'] }),
    User.findByPk(p.authorId, { attributes: ['id', 'name'] }),
    ProposalTrial.findAll({ where: { proposalId: p.id } }),
    Vote.findAll({ where: { proposalId: p.id }, order: [['updatedAt', 'ASC']], include: [{ model: User, as: 'voter', attributes: ['name'] }] }),
    PublishedVerdict.findAll({ where: { feedstockId: p.feedstockId } }),
    p.decidedBy ? User.findByPk(p.decidedBy, { attributes: ['name'] }) : null,
    p.claimedBy ? User.findByPk(p.claimedBy, { attributes: ['name'] }) : null,
  ]);
  const trials = links.length
    ? await Trial.findAll({ where: { id: links.map((l) => l.trialId) }, order: [['id', 'ASC']] })
    : [];
  const visible = votes.filter((v) => !v.hiddenAt);
  const agree = visible.filter((v) => v.agree).length;
  const mine = viewer ? votes.find((v) => v.voterId === viewer.id) : undefined;
  const claimActive = p.claimedBy && p.claimedUntil && p.claimedUntil > new Date();
  return {
    id: p.id,
    feedstock: { id: feedstock!.id, slug: feedstock!.slug, name: feedstock!.name },
    authorName: displayName(author),
    authorId: p.authorId,
    status: p.status,
    hidden: !!p.hiddenAt,
    settings: p.settings,
    current: published.map((v) => ({ setting: v.setting, verdict: v.verdict, ceilingKgM2: v.ceilingKgM2 })),
    stale: p.status === 'open' && feedstock!.verdictVersion !== p.baseVerdictVersion,
    rationale: p.rationale,
    trials: trials.map((t) => ({
      id: t.id,
      setting: t.setting,
      preparation: t.preparation,
      surfaceLoadKgM2: t.surfaceLoadKgM2,
      status: t.status,
      outcome: t.confirmedOutcome,
      region: t.region,
    })),
    tally: tallyVotes(agree, visible.length - agree),
    votes: votes
      .filter((v) => moderator || !v.hiddenAt)
      .map((v) => ({
        id: v.id,
        voterName: displayName((v as unknown as { voter?: User }).voter),
        agree: v.agree,
        reason: v.reason,
        hidden: !!v.hiddenAt,
        updatedAt: v.updatedAt.toISOString(),
      })),
    myVote: mine ? { agree: mine.agree, reason: mine.reason } : null,
    decision: p.decidedAt ? { by: decider ? displayName(decider) : null, at: p.decidedAt.toISOString(), note: p.decisionNote } : null,
    claim: claimActive ? { by: displayName(claimer), until: p.claimedUntil!.toISOString() } : null,
    createdAt: p.createdAt.toISOString(),
    isDemo: p.isDemo,
  };
}

/** One item of the review queue. */
export interface ReviewItem {
  kind: 'ready-proposal' | 'open-proposal' | 'mismatch' | 'pending-edit' | 'request';
  id: string;
  title: string;
  href: string;
  detail: string;
  since: string;
  waitingDays: number;
}

/** The review queue with how long items have waited (oldest, median). */
export interface ReviewQueue {
  items: ReviewItem[];
  waiting: { oldestDays: number | null; medianDays: number | null; count: number };
}

const daysSince = (d: Date, now: Date) => Math.max(0, Math.floor((now.getTime() - d.getTime()) / 86_400_000));

/**
 * The moderators' queue: ready proposals first (consensus reached), then open
 * ones, then feedstocks whose evidence verdict disagrees with the published
 * one (added automatically), pending page edits and requested feedstocks.
 * Oldest first within each kind.
 */
export async function getReviewQueue(now = new Date()): Promise<ReviewQueue> {
  const proposals = await Proposal.findAll({ where: { status: 'open', hiddenAt: null }, order: [['createdAt', 'ASC']] });
  const ids = proposals.map((p) => p.id);
  const counts = ids.length
    ? await sequelize.query<{ proposal_id: number; agree: number; n: number }>(
        'SELECT proposal_id, SUM(agree) AS agree, COUNT(*) AS n FROM votes WHERE hidden_at IS NULL AND proposal_id IN (:ids) GROUP BY proposal_id',
        { replacements: { ids }, type: QueryTypes.SELECT },
      )
    : [];
  const byProposal = new Map(counts.map((c) => [Number(c.proposal_id), tallyVotes(Number(c.agree), Number(c.n) - Number(c.agree))]));
  const feedstockIds = new Set(proposals.map((p) => p.feedstockId));

  const [evidence, published, edits, requests] = await Promise.all([
    EvidenceVerdict.findAll({ attributes: ['feedstockId', 'setting', 'verdict', 'computedAt'] }),
    PublishedVerdict.findAll({ attributes: ['feedstockId', 'setting', 'verdict'] }),
    FeedstockRevision.findAll({ where: { status: 'pending' }, order: [['createdAt', 'ASC']] }),
    FeedstockRequest.findAll({ where: { status: 'open' }, order: [['createdAt', 'ASC']] }),
  ]);
  const pub = new Map(published.map((p) => [`${p.feedstockId}:${p.setting}`, p.verdict]));
  const mismatches = evidence.filter((e) => e.verdict !== 'unsettled' && pub.has(`${e.feedstockId}:${e.setting}`) && pub.get(`${e.feedstockId}:${e.setting}`) !== e.verdict);
  for (const m of mismatches) feedstockIds.add(m.feedstockId);
  for (const e of edits) feedstockIds.add(e.feedstockId);
  const feedstocks = new Map(
    (await Feedstock.findAll({ where: { id: { [Op.in]: [...feedstockIds] } }, attributes: ['id', 'slug', 'name'] })).map((f) => [f.id, f]),
  );

  const items: ReviewItem[] = [];
  const proposalItems = proposals.map((p) => {
    const t = byProposal.get(p.id) ?? tallyVotes(0, 0);
    const f = feedstocks.get(p.feedstockId);
    return {
      kind: t.ready ? ('ready-proposal' as const) : ('open-proposal' as const),
      id: `proposal-${p.id}`,
      title: `Proposal ${p.id}: ${f?.name ?? 'feedstock'}`,
      href: `/proposals/${p.id}`,
      detail: `${t.agree} agree, ${t.disagree} disagree${t.ready ? ' — ready for a decision' : ` (${t.missing})`}`,
      since: p.createdAt.toISOString(),
      waitingDays: daysSince(p.createdAt, now),
    };
  });
  items.push(...proposalItems.filter((i) => i.kind === 'ready-proposal'), ...proposalItems.filter((i) => i.kind === 'open-proposal'));
  for (const m of mismatches) {
    const f = feedstocks.get(m.feedstockId);
    items.push({
      kind: 'mismatch',
      id: `mismatch-${m.feedstockId}-${m.setting}`,
      title: `${f?.name ?? 'Feedstock'} in ${SETTING_PLURALS[m.setting]}`,
      href: `/feedstocks/${f?.slug ?? ''}`,
      detail: `Evidence says ${VERDICT_LABELS[m.verdict]}; published is ${VERDICT_LABELS[pub.get(`${m.feedstockId}:${m.setting}`)!]}`,
      since: m.computedAt.toISOString(),
      waitingDays: daysSince(m.computedAt, now),
    });
  }
  for (const e of edits) {
    const f = feedstocks.get(e.feedstockId);
    items.push({
      kind: 'pending-edit',
      id: `edit-${e.id}`,
      title: `Page edit: ${f?.name ?? 'feedstock'}`,
      href: `/feedstocks/${f?.slug ?? ''}/history`,
      detail: e.editSummary || 'No summary',
      since: e.createdAt.toISOString(),
      waitingDays: daysSince(e.createdAt, now),
    });
  }
  for (const r of requests) {
    items.push({
      kind: 'request',
      id: `request-${r.id}`,
      title: `Requested: ${r.name}`,
      href: '/review#requests',
      detail: r.note ?? '',
      since: r.createdAt.toISOString(),
      waitingDays: daysSince(r.createdAt, now),
    });
  }
  const waits = items.map((i) => i.waitingDays).sort((a, b) => a - b);
  const median = waits.length ? (waits.length % 2 ? waits[(waits.length - 1) / 2] : (waits[waits.length / 2 - 1] + waits[waits.length / 2]) / 2) : null;
  return { items, waiting: { oldestDays: waits.length ? waits[waits.length - 1] : null, medianDays: median, count: items.length } };
}

/** Published-verdict history of a feedstock, newest first: who, when, which proposal, the note. */
export async function listVerdictHistory(feedstockId: number) {
  const rows = await VerdictHistory.findAll({ where: { feedstockId }, order: [['decidedAt', 'DESC'], ['id', 'DESC']] });
  const deciders = new Map(
    (await User.findAll({ where: { id: [...new Set(rows.map((r) => r.decidedBy).filter((x): x is string => !!x))] }, attributes: ['id', 'name'] })).map((u) => [u.id, u]),
  );
  return rows.map((r) => ({
    id: r.id,
    setting: r.setting,
    previousVerdict: r.previousVerdict,
    verdict: r.verdict,
    ceilingKgM2: r.ceilingKgM2,
    proposalId: r.proposalId,
    decidedBy: r.decidedBy ? displayName(deciders.get(r.decidedBy)) : null,
    note: r.note,
    decidedAt: r.decidedAt.toISOString(),
  }));
}

/** What the proposal form needs: the feedstock, its evidence verdicts (to prefill) and its trials (to cite). */
export async function getProposeContext(slug: string) {
  const feedstock = await Feedstock.findOne({ where: { slug, mergedIntoId: null }, attributes: ['id', 'slug', 'name'] });
  if (!feedstock) return null;
  const [evidence, published, trials] = await Promise.all([
    EvidenceVerdict.findAll({ where: { feedstockId: feedstock.id } }),
    PublishedVerdict.findAll({ where: { feedstockId: feedstock.id } }),
    Trial.findAll({ where: { feedstockId: feedstock.id }, order: [['id', 'ASC']], attributes: ['id', 'setting', 'preparation', 'surfaceLoadKgM2', 'status', 'confirmedOutcome'] }),
  ]);
  return {
    feedstock: { id: feedstock.id, slug: feedstock.slug, name: feedstock.name },
    evidence: evidence.map((e) => {
      const result = e.result as { derivation?: { drivingTrialIds?: string[] } } | null;
      return {
        setting: e.setting,
        verdict: e.verdict,
        ceilingKgM2: e.ceilingKgM2,
        drivingTrialIds: (result?.derivation?.drivingTrialIds ?? []).map(Number),
      };
    }),
    published: published.map((p) => ({ setting: p.setting, verdict: p.verdict, ceilingKgM2: p.ceilingKgM2, cautions: p.cautions })),
    trials: trials.map((t) => ({ id: t.id, setting: t.setting, preparation: t.preparation, surfaceLoadKgM2: t.surfaceLoadKgM2, status: t.status, outcome: t.confirmedOutcome })),
  };
}
export type ProposeContext = NonNullable<Awaited<ReturnType<typeof getProposeContext>>>;

/** Open (visible) proposals of a feedstock with their tallies, oldest first. */
export async function listOpenProposals(feedstockId: number) {
  const rows = await Proposal.findAll({ where: { feedstockId, status: 'open', hiddenAt: null }, order: [['createdAt', 'ASC']] });
  if (!rows.length) return [];
  const counts = await sequelize.query<{ proposal_id: number; agree: number; n: number }>(
    'SELECT proposal_id, SUM(agree) AS agree, COUNT(*) AS n FROM votes WHERE hidden_at IS NULL AND proposal_id IN (:ids) GROUP BY proposal_id',
    { replacements: { ids: rows.map((r) => r.id) }, type: QueryTypes.SELECT },
  );
  const byId = new Map(counts.map((c) => [Number(c.proposal_id), tallyVotes(Number(c.agree), Number(c.n) - Number(c.agree))]));
  return rows.map((p) => ({ id: p.id, settings: p.settings, createdAt: p.createdAt.toISOString(), tally: byId.get(p.id) ?? tallyVotes(0, 0) }));
}

/** The feedstock a proposal is about (id and current slug), or null; for dropping cached pages after a write. */
export async function getProposalFeedstockRef(proposalId: number): Promise<{ id: number; slug: string } | null> {
  const [row] = await sequelize.query<{ id: number; slug: string }>(
    'SELECT f.id, f.slug FROM proposals p JOIN feedstocks f ON f.id = p.feedstock_id WHERE p.id = ?',
    { replacements: [proposalId], type: QueryTypes.SELECT },
  );
  return row ? { id: Number(row.id), slug: row.slug } : null;
}

/** The feedstock of the proposal a vote belongs to, or null. */
export async function getVoteFeedstockRef(voteId: number): Promise<{ id: number; slug: string } | null> {
  const [row] = await sequelize.query<{ id: number; slug: string }>(
    'SELECT f.id, f.slug FROM votes v JOIN proposals p ON p.id = v.proposal_id JOIN feedstocks f ON f.id = p.feedstock_id WHERE v.id = ?',
    { replacements: [voteId], type: QueryTypes.SELECT },
  );
  return row ? { id: Number(row.id), slug: row.slug } : null;
}
