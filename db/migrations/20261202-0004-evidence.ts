import { DataTypes } from 'sequelize';
import { id, ref, CERTAINTY, PREPARATIONS, SETTINGS, VERDICTS, type Migration } from './_shared';

/**
 * What the evidence engine computed: one row per feedstock × setting × preparation
 * (`evidence_aggregates`) and one per feedstock × setting (`evidence_verdicts`).
 * Derived data: `npm run recompute` rebuilds it from trials at any time.
 */
export const migration: Migration = {
  name: '20261202-0004-evidence',
  async up({ context: q }) {
    await q.createTable('evidence_aggregates', {
      id: id(),
      feedstock_id: ref('feedstocks'),
      setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
      preparation: { type: DataTypes.ENUM(...PREPARATIONS), allowNull: false },
      verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
      certainty: { type: DataTypes.ENUM(...CERTAINTY), allowNull: false },
      trial_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      finished_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      contributor_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      success_rate: { type: DataTypes.DOUBLE, allowNull: true },
      wilson_low: { type: DataTypes.DOUBLE, allowNull: true },
      wilson_high: { type: DataTypes.DOUBLE, allowNull: true },
      harm_rate: { type: DataTypes.DOUBLE, allowNull: true },
      ceiling_kg_m2: { type: DataTypes.DOUBLE, allowNull: true },
      median_days: { type: DataTypes.DOUBLE, allowNull: true },
      median_days_low: { type: DataTypes.DOUBLE, allowNull: true },
      median_days_high: { type: DataTypes.DOUBLE, allowNull: true },
      /** The whole engine result for this group, derivation included. */
      result: { type: DataTypes.JSON, allowNull: false },
      rules_version: { type: DataTypes.STRING(40), allowNull: false },
      computed_at: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('evidence_aggregates', ['feedstock_id', 'setting', 'preparation'], {
      unique: true,
      name: 'evidence_aggregates_group',
    });
    await q.createTable('evidence_verdicts', {
      id: id(),
      feedstock_id: ref('feedstocks'),
      setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
      verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
      certainty: { type: DataTypes.ENUM(...CERTAINTY), allowNull: false },
      ceiling_kg_m2: { type: DataTypes.DOUBLE, allowNull: true },
      trial_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      result: { type: DataTypes.JSON, allowNull: false },
      rules_version: { type: DataTypes.STRING(40), allowNull: false },
      computed_at: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('evidence_verdicts', ['feedstock_id', 'setting'], { unique: true, name: 'evidence_verdicts_setting' });
  },
  async down({ context: q }) {
    await q.dropTable('evidence_verdicts');
    await q.dropTable('evidence_aggregates');
  },
};
