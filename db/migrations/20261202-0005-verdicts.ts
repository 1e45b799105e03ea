import { DataTypes } from 'sequelize';
import { id, ref, timestamps, userRef, SETTINGS, VERDICTS, type Migration } from './_shared';

/** Published verdicts, their history, verdict proposals with cited trials, and votes. */
export const migration: Migration = {
  name: '20261202-0005-verdicts',
  async up({ context: q }) {
    await q.createTable('proposals', {
      id: id(),
      feedstock_id: ref('feedstocks'),
      author_id: userRef(false, 'RESTRICT'),
      /** feedstocks.verdict_version when the proposal was made: approval checks it (optimistic lock). */
      base_verdict_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      /** Per setting: { setting, verdict, ceilingKgM2, cautions[] }. */
      settings: { type: DataTypes.JSON, allowNull: false },
      rationale: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.ENUM('open', 'approved', 'rejected', 'withdrawn'), allowNull: false, defaultValue: 'open' },
      decided_by: userRef(true),
      decided_at: { type: DataTypes.DATE(3), allowNull: true },
      decision_note: { type: DataTypes.TEXT, allowNull: true },
      claimed_by: userRef(true),
      claimed_until: { type: DataTypes.DATE(3), allowNull: true },
      hidden_at: { type: DataTypes.DATE(3), allowNull: true },
      hidden_by: userRef(true),
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      is_demo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...timestamps(),
    });
    await q.addIndex('proposals', ['feedstock_id', 'status'], { name: 'proposals_feedstock_status' });
    await q.createTable('proposal_trials', {
      proposal_id: { ...ref('proposals'), primaryKey: true },
      trial_id: { ...ref('trials'), primaryKey: true },
    });
    await q.createTable('votes', {
      id: id(),
      proposal_id: ref('proposals'),
      voter_id: userRef(false, 'CASCADE'),
      agree: { type: DataTypes.BOOLEAN, allowNull: false },
      reason: { type: DataTypes.STRING(500), allowNull: false },
      hidden_at: { type: DataTypes.DATE(3), allowNull: true },
      hidden_by: userRef(true),
      ...timestamps(),
    });
    // One vote per person per proposal, held by the database itself.
    await q.addIndex('votes', ['proposal_id', 'voter_id'], { unique: true, name: 'votes_one_per_voter' });
    await q.createTable('published_verdicts', {
      id: id(),
      feedstock_id: ref('feedstocks'),
      setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
      verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
      ceiling_kg_m2: { type: DataTypes.DOUBLE, allowNull: true },
      cautions: { type: DataTypes.JSON, allowNull: false },
      proposal_id: ref('proposals', true),
      published_at: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('published_verdicts', ['feedstock_id', 'setting'], { unique: true, name: 'published_verdicts_setting' });
    await q.createTable('verdict_history', {
      id: id(),
      feedstock_id: ref('feedstocks'),
      setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
      previous_verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: true },
      verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
      ceiling_kg_m2: { type: DataTypes.DOUBLE, allowNull: true },
      cautions: { type: DataTypes.JSON, allowNull: false },
      proposal_id: ref('proposals', true),
      decided_by: userRef(true),
      note: { type: DataTypes.TEXT, allowNull: false },
      decided_at: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('verdict_history', ['feedstock_id', 'decided_at'], { name: 'verdict_history_feedstock' });
  },
  async down({ context: q }) {
    await q.dropTable('verdict_history');
    await q.dropTable('published_verdicts');
    await q.dropTable('votes');
    await q.dropTable('proposal_trials');
    await q.dropTable('proposals');
  },
};
