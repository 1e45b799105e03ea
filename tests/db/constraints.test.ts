import { afterAll, describe, expect, it } from 'vitest';
import { UniqueConstraintError } from 'sequelize';
import { sequelize } from '@/db';
import { Feedstock, FeedstockAlias, Proposal, User, Vote } from '@/db/models';
import { buildFeedstock, buildProposal, buildUser } from '../support/factories';

// Integrity the database itself holds (unique keys), not only the services.
describe('database constraints', () => {
  const made: { users: string[]; feedstocks: number[] } = { users: [], feedstocks: [] };
  afterAll(async () => {
    await Proposal.destroy({ where: { feedstockId: made.feedstocks } });
    await Feedstock.destroy({ where: { id: made.feedstocks } });
    await User.destroy({ where: { id: made.users } });
    await sequelize.close();
  });

  it('refuses a second vote by the same user on one proposal', async () => {
    const author = await buildUser();
    const voter = await buildUser();
    const fs = await buildFeedstock();
    made.users.push(author.id, voter.id);
    made.feedstocks.push(fs.id);
    const proposal = await buildProposal(fs, author);
    await Vote.create({ proposalId: proposal.id, voterId: voter.id, agree: true, reason: 'Trial 3 matches.' });
    await expect(
      Vote.create({ proposalId: proposal.id, voterId: voter.id, agree: false, reason: 'Changed my mind.' }),
    ).rejects.toBeInstanceOf(UniqueConstraintError);
    // The bypass a buggy service might try: raw SQL is refused the same way.
    await expect(
      sequelize.query('INSERT INTO votes (proposal_id, voter_id, agree, reason) VALUES (?, ?, 1, ?)', {
        replacements: [proposal.id, voter.id, 'again'],
      }),
    ).rejects.toBeInstanceOf(UniqueConstraintError);
    expect(await Vote.count({ where: { proposalId: proposal.id } })).toBe(1);
  });

  it('refuses a duplicate feedstock slug and a duplicate alias', async () => {
    const a = await buildFeedstock();
    made.feedstocks.push(a.id);
    await expect(buildFeedstock({ slug: a.slug })).rejects.toBeInstanceOf(UniqueConstraintError);
    const b = await buildFeedstock();
    made.feedstocks.push(b.id);
    await FeedstockAlias.create({ feedstockId: a.id, alias: `alias-${a.slug}` });
    await expect(FeedstockAlias.create({ feedstockId: b.id, alias: `alias-${a.slug}` })).rejects.toBeInstanceOf(UniqueConstraintError);
  });

  it('refuses two accounts with one e-mail address', async () => {
    const u = await buildUser();
    made.users.push(u.id);
    await expect(buildUser({ email: u.email! })).rejects.toBeInstanceOf(UniqueConstraintError);
  });
});
