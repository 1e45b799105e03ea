import { DataTypes } from 'sequelize';
import { id, ref, timestamps, userRef, type Migration } from './_shared';

/** Feedstocks, their aliases and redirects, page-text revisions and requests for new feedstocks. */
export const migration: Migration = {
  name: '20261202-0002-feedstocks',
  async up({ context: q }) {
    await q.createTable('feedstocks', {
      id: id(),
      slug: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(160), allowNull: false },
      category: {
        type: DataTypes.ENUM('fruit', 'vegetable', 'grain-starch', 'paper-card', 'garden', 'manure', 'animal-product', 'other'),
        allowNull: false,
      },
      family: { type: DataTypes.STRING(80), allowNull: true },
      cn_ratio: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
      nitrogen_pct: { type: DataTypes.DECIMAL(6, 3), allowNull: true },
      moisture_pct: { type: DataTypes.DECIMAL(5, 2), allowNull: true },
      bulk_density_kg_m3: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
      reference_source: { type: DataTypes.STRING(300), allowNull: true },
      summary: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
      page_text: { type: DataTypes.TEXT('medium'), allowNull: false },
      handling_cautions: { type: DataTypes.JSON, allowNull: false },
      merged_into_id: ref('feedstocks', true),
      /** Bumped by every text edit: concurrent edits against an older text conflict. */
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      /** Bumped by every published-verdict change: the optimistic lock for proposals. */
      verdict_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      is_demo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...timestamps(),
    });
    await q.addIndex('feedstocks', ['category'], { name: 'feedstocks_category' });
    await q.addIndex('feedstocks', ['family'], { name: 'feedstocks_family' });
    await q.createTable('feedstock_aliases', {
      id: id(),
      feedstock_id: ref('feedstocks'),
      alias: { type: DataTypes.STRING(160), allowNull: false, unique: true },
      ...timestamps(),
    });
    await q.createTable('feedstock_redirects', {
      id: id(),
      old_slug: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      feedstock_id: ref('feedstocks'),
      ...timestamps(),
    });
    await q.createTable('feedstock_revisions', {
      id: id(),
      feedstock_id: ref('feedstocks'),
      author_id: userRef(true),
      body: { type: DataTypes.TEXT('medium'), allowNull: false },
      edit_summary: { type: DataTypes.STRING(255), allowNull: false, defaultValue: '' },
      status: { type: DataTypes.ENUM('pending', 'published', 'rejected'), allowNull: false },
      /** The feedstock text version the edit was made against. */
      base_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      reviewer_id: userRef(true),
      reviewed_at: { type: DataTypes.DATE(3), allowNull: true },
      review_note: { type: DataTypes.TEXT, allowNull: true },
      ...timestamps(),
    });
    await q.addIndex('feedstock_revisions', ['feedstock_id', 'status'], { name: 'feedstock_revisions_status' });
    await q.createTable('feedstock_requests', {
      id: id(),
      name: { type: DataTypes.STRING(160), allowNull: false },
      note: { type: DataTypes.TEXT, allowNull: true },
      requester_id: userRef(true),
      status: { type: DataTypes.ENUM('open', 'added', 'declined'), allowNull: false, defaultValue: 'open' },
      feedstock_id: ref('feedstocks', true),
      is_demo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...timestamps(),
    });
  },
  async down({ context: q }) {
    await q.dropTable('feedstock_requests');
    await q.dropTable('feedstock_revisions');
    await q.dropTable('feedstock_redirects');
    await q.dropTable('feedstock_aliases');
    await q.dropTable('feedstocks');
  },
};
