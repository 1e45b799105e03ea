import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import { Feedstock, OutboxMessage, Proposal, PublishedVerdict, Subscription, User, VerdictHistory, Vote } from '@/db/models';
import { READY_AGREE_SHARE, READY_MIN_VOTES, tallyVotes } from '@/lib/consensus';
import { castVote, claimProposal, createProposal, decideProposal, getTally, setVoteHidden } from '@/lib/services/proposals';
import { buildFeedstock, buildUser } from '../support/factories';

const DAY = 86_400_000;
const actorOf = (u: User) => ({ id: u.id, role: u.role, emailVerified: true, createdAt: u.createdAt });
const settled = { createdAt: new Date(Date.now() - 30 * DAY) };

// Proposals, votes and moderation on the real MariaDB: concurrency and faults included.
describe('verdict proposals', () => {
  const users: User[] = [];
  const feedstocks: Feedstock[] = [];
  let author: User;
  let moderatorA: User;
  let moderatorB: User;

  const newUser = async (role: User['role'] = 'contributor') => {
    const u = await buildUser({ role, ...settled });
    users.push(u);
    return u;
  };
  const newFeedstock = async () => {
    const f = await buildFeedstock();
    feedstocks.push(f);
    await PublishedVerdict.create({ feedstockId: f.id, setting: 'bin', verdict: 'limit', ceilingKgM2: 2, cautions: ['heating'], proposalId: null, publishedAt: new Date() });
    return f;
  };
  const propose = (f: Feedstock, verdict: 'feed' | 'avoid' = 'feed', by = author) =>
    createProposal(actorOf(by), {
      feedstockId: f.id,
      settings: [{ setting: 'bin', verdict, ceilingKgM2: verdict === 'feed' ? 4 : null, cautions: [] }],
      rationale: 'Five consumed bin trials at 2 to 4 kg/m² with no heating.',
    });

  beforeAll(async () => {
    author = await newUser();
    moderatorA = await newUser('moderator');
    moderatorB = await newUser('moderator');
  });
  afterAll(async () => {
    const ids = feedstocks.map((f) => f.id);
    await Proposal.destroy({ where: { feedstockId: ids } });
    await Subscription.destroy({ where: { feedstockId: ids } });
    await OutboxMessage.destroy({ where: { feedstockId: ids } });
    await Feedstock.destroy({ where: { id: ids } });
    await sequelize.query('DELETE FROM audit_log WHERE actor_id IN (:ids)', { replacements: { ids: users.map((u) => u.id) } });
    await User.destroy({ where: { id: users.map((u) => u.id) } });
    await sequelize.close();
  });

  it('applies the documented consensus rule: at least 3 votes, two thirds agreeing', () => {
    expect(READY_MIN_VOTES).toBe(3);
    expect(READY_AGREE_SHARE).toBeCloseTo(2 / 3, 12);
    expect(tallyVotes(2, 0).ready).toBe(false);
    expect(tallyVotes(2, 1).ready).toBe(true); // exactly two thirds
    expect(tallyVotes(3, 2).ready).toBe(false); // 60 %
    expect(tallyVotes(4, 2).ready).toBe(true);
  });

  it('counts 50 different users voting at once exactly', async () => {
    const f = await newFeedstock();
    const { id } = await propose(f);
    const voters = await Promise.all(Array.from({ length: 50 }, () => newUser()));
    await Promise.all(voters.map((v, i) => castVote(actorOf(v), id, { agree: i % 5 !== 0, reason: `Trial notes ${i}` })));
    const tally = await getTally(id);
    expect(tally).toMatchObject({ agree: 40, disagree: 10, total: 50, ready: true });
    expect(await Vote.count({ where: { proposalId: id } })).toBe(50);
  });

  it('stores one vote for a double submit, and lets the voter change it while open', async () => {
    const f = await newFeedstock();
    const { id } = await propose(f);
    const voter = await newUser();
    await Promise.all([
      castVote(actorOf(voter), id, { agree: true, reason: 'Matches my bin trial.' }),
      castVote(actorOf(voter), id, { agree: true, reason: 'Matches my bin trial.' }),
    ]);
    expect(await Vote.count({ where: { proposalId: id, voterId: voter.id } })).toBe(1);
    await castVote(actorOf(voter), id, { agree: false, reason: 'On reflection the loads were low.' });
    const vote = await Vote.findOne({ where: { proposalId: id, voterId: voter.id } });
    expect(vote!.agree).toBe(false);
  });

  it('refuses a vote on one’s own proposal, from a very new account, and after the decision', async () => {
    const f = await newFeedstock();
    const { id } = await propose(f);
    await expect(castVote(actorOf(author), id, { agree: true, reason: 'Mine.' })).rejects.toMatchObject({ status: 403 });
    const fresh = await buildUser({ role: 'contributor' });
    users.push(fresh);
    await expect(castVote(actorOf(fresh), id, { agree: true, reason: 'New here.' })).rejects.toMatchObject({ status: 403 });
    await decideProposal(actorOf(moderatorA), id, { decision: 'reject', note: 'Loads too low to say.' });
    const late = await newUser();
    await expect(castVote(actorOf(late), id, { agree: true, reason: 'Late vote.' })).rejects.toMatchObject({ status: 409 });
  });

  it('publishes exactly one of two conflicting proposals approved at once; the other gets 409', async () => {
    const f = await newFeedstock();
    const p1 = await propose(f, 'feed');
    const p2 = await propose(f, 'avoid');
    const results = await Promise.allSettled([
      decideProposal(actorOf(moderatorA), p1.id, { decision: 'approve', note: 'Evidence supports it.' }),
      decideProposal(actorOf(moderatorB), p2.id, { decision: 'approve', note: 'Evidence supports it too.' }),
    ]);
    const ok = results.filter((r) => r.status === 'fulfilled');
    const failed = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(ok).toHaveLength(1);
    expect(failed).toHaveLength(1);
    expect(failed[0].reason).toMatchObject({ status: 409, code: 'conflict' });
    expect(failed[0].reason.message).toMatch(/published verdict changed after this proposal was made/);
    const published = await PublishedVerdict.findAll({ where: { feedstockId: f.id } });
    expect(published).toHaveLength(1);
    const history = await VerdictHistory.findAll({ where: { feedstockId: f.id } });
    expect(history).toHaveLength(1);
    expect(published[0].proposalId).toBe(history[0].proposalId);
    expect(history[0].previousVerdict).toBe('limit');
    const refreshed = await Feedstock.findByPk(f.id);
    expect(refreshed!.verdictVersion).toBe(f.verdictVersion + 1);
    const statuses = (await Proposal.findAll({ where: { feedstockId: f.id }, order: [['id', 'ASC']] })).map((p) => p.status).sort();
    expect(statuses).toEqual(['approved', 'open']);
  });

  it('leaves nothing half-published when the database connection drops mid-approval', async () => {
    const f = await newFeedstock();
    const sub = await Subscription.create({ feedstockId: f.id, email: 'follower@example.test', confirmedAt: new Date() });
    const { id } = await propose(f, 'feed');
    const outboxBefore = await OutboxMessage.count({ where: { feedstockId: f.id } });
    const before = {
      published: (await PublishedVerdict.findAll({ where: { feedstockId: f.id }, raw: true })),
      version: (await Feedstock.findByPk(f.id))!.verdictVersion,
    };
    // Kill the approval's own connection from another connection, after the
    // published verdict and history are written but before the commit.
    await expect(
      decideProposal(actorOf(moderatorA), id, { decision: 'approve', note: 'Looks right.' }, async (step, transaction) => {
        if (step !== 'outbox') return;
        const [row] = await sequelize.query<{ id: number }>('SELECT CONNECTION_ID() AS id', { type: QueryTypes.SELECT, transaction });
        await sequelize.query(`KILL CONNECTION ${Number(row.id)}`);
      }),
    ).rejects.toThrow(/connection|closed|killed|socket|interrupted/i);
    expect(await PublishedVerdict.findAll({ where: { feedstockId: f.id }, raw: true })).toEqual(before.published);
    expect((await Feedstock.findByPk(f.id))!.verdictVersion).toBe(before.version);
    expect(await VerdictHistory.count({ where: { proposalId: id } })).toBe(0);
    expect((await Proposal.findByPk(id))!.status).toBe('open');
    expect(await OutboxMessage.count({ where: { feedstockId: f.id } })).toBe(outboxBefore);
    // And the same approval succeeds afterwards, writing everything once.
    await decideProposal(actorOf(moderatorA), id, { decision: 'approve', note: 'Looks right.' });
    expect(await VerdictHistory.count({ where: { proposalId: id } })).toBe(1);
    expect(await OutboxMessage.count({ where: { feedstockId: f.id, subscriptionId: sub.id, kind: 'verdict-decided' } })).toBe(1);
  });

  it('lets one reviewer claim a proposal; moderators hide abusive votes from the tally', async () => {
    const f = await newFeedstock();
    const { id } = await propose(f);
    await claimProposal(actorOf(moderatorA), id);
    await expect(claimProposal(actorOf(moderatorB), id)).rejects.toMatchObject({ status: 409 });
    await expect(decideProposal(actorOf(moderatorB), id, { decision: 'approve', note: 'Mine now.' })).rejects.toMatchObject({ status: 409 });
    const voter = await newUser();
    await castVote(actorOf(voter), id, { agree: false, reason: 'rude words' });
    const vote = await Vote.findOne({ where: { proposalId: id, voterId: voter.id } });
    await setVoteHidden(actorOf(moderatorA), vote!.id, { hidden: true, reason: 'Abusive comment.' });
    expect((await getTally(id)).total).toBe(0);
    await expect(setVoteHidden(actorOf(voter), vote!.id, { hidden: false, reason: 'unhide' })).rejects.toMatchObject({ status: 403 });
  });

  it('refuses bad input with field messages and stores nothing', async () => {
    const f = await newFeedstock();
    const before = await Proposal.count({ where: { feedstockId: f.id } });
    await expect(
      createProposal(actorOf(author), { feedstockId: f.id, settings: [], rationale: 'short' }),
    ).rejects.toMatchObject({ name: 'ZodError' });
    await expect(
      createProposal(actorOf(author), { feedstockId: f.id, settings: [{ setting: 'bin', verdict: 'feed' }], rationale: 'A rationale that is long enough.', trialIds: [999999999] }),
    ).rejects.toMatchObject({ status: 400, fieldErrors: { trialIds: expect.any(Array) } });
    expect(await Proposal.count({ where: { feedstockId: f.id } })).toBe(before);
  });
});
