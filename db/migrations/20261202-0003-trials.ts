import { DataTypes } from 'sequelize';
import { id, ref, timestamps, userRef, OUTCOMES, PREPARATIONS, SETTINGS, type Migration } from './_shared';

/** Feeding trials, their check-ins and photos. Region only: never an exact location. */
export const migration: Migration = {
  name: '20261202-0003-trials',
  async up({ context: q }) {
    await q.createTable('trials', {
      id: id(),
      feedstock_id: ref('feedstocks', false, 'RESTRICT'),
      owner_id: userRef(false, 'RESTRICT'),
      setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
      preparation: { type: DataTypes.ENUM(...PREPARATIONS), allowNull: false },
      provenance: { type: DataTypes.ENUM('home-grown', 'store-bought', 'commercial-scrap'), allowNull: false },
      surface_area_m2: { type: DataTypes.DECIMAL(10, 4), allowNull: false },
      bed_depth_cm: { type: DataTypes.DECIMAL(7, 2), allowNull: true },
      species: {
        type: DataTypes.ENUM('eisenia-fetida', 'eisenia-andrei', 'perionyx-excavatus', 'eudrilus-eugeniae', 'mixed-unknown'),
        allowNull: false,
      },
      worm_mass_kg: { type: DataTypes.DECIMAL(10, 4), allowNull: true },
      dose_amount: { type: DataTypes.DECIMAL(12, 4), allowNull: false },
      dose_unit: { type: DataTypes.STRING(8), allowNull: false },
      /** Normalised by the evidence engine when the trial is saved. */
      dose_kg: { type: DataTypes.DECIMAL(14, 6), allowNull: false },
      surface_load_kg_m2: { type: DataTypes.DECIMAL(14, 6), allowNull: false },
      layer_depth_cm: { type: DataTypes.DECIMAL(7, 2), allowNull: true },
      feed_ratio: { type: DataTypes.DECIMAL(14, 6), allowNull: true },
      paired_trial_id: ref('trials', true),
      is_control: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      region: { type: DataTypes.STRING(80), allowNull: false },
      start_date: { type: DataTypes.DATEONLY, allowNull: false },
      check_in_every_days: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 7 },
      status: { type: DataTypes.ENUM('running', 'closed', 'abandoned'), allowNull: false, defaultValue: 'running' },
      proposed_outcome: { type: DataTypes.ENUM(...OUTCOMES), allowNull: true },
      confirmed_outcome: { type: DataTypes.ENUM(...OUTCOMES), allowNull: true },
      close_reason: { type: DataTypes.TEXT, allowNull: true },
      closed_at: { type: DataTypes.DATE(3), allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: false },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      is_demo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...timestamps(),
    });
    await q.addIndex('trials', ['feedstock_id', 'setting'], { name: 'trials_feedstock_setting' });
    await q.addIndex('trials', ['owner_id', 'status'], { name: 'trials_owner_status' });
    await q.createTable('check_ins', {
      id: id(),
      trial_id: ref('trials'),
      author_id: userRef(false, 'RESTRICT'),
      observed_on: { type: DataTypes.DATEONLY, allowNull: false },
      /** The observer's UTC offset when the check-in was recorded, in minutes. */
      utc_offset_minutes: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
      worm_activity: { type: DataTypes.ENUM('none', 'few', 'many', 'swarming'), allowNull: false },
      share_remaining_pct: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
      bed_temp_c: { type: DataTypes.DECIMAL(5, 2), allowNull: true },
      mould: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      smell: { type: DataTypes.ENUM('none', 'earthy', 'sour', 'rotten', 'ammonia'), allowNull: false, defaultValue: 'none' },
      moisture: { type: DataTypes.ENUM('dry', 'damp', 'wet', 'waterlogged'), allowNull: false, defaultValue: 'damp' },
      ph: { type: DataTypes.DECIMAL(4, 2), allowNull: true },
      pests: { type: DataTypes.JSON, allowNull: false },
      worm_deaths: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      exodus: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      notes: { type: DataTypes.TEXT, allowNull: false },
      ...timestamps(),
    });
    await q.addIndex('check_ins', ['trial_id', 'observed_on'], { name: 'check_ins_trial_date' });
    await q.createTable('photos', {
      id: id(),
      trial_id: ref('trials'),
      check_in_id: ref('check_ins', true, 'CASCADE'),
      uploader_id: userRef(false, 'RESTRICT'),
      storage_key: { type: DataTypes.STRING(255), allowNull: false, unique: true },
      thumb_key: { type: DataTypes.STRING(255), allowNull: false },
      content_type: { type: DataTypes.STRING(40), allowNull: false },
      width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
      ...timestamps(),
    });
    await q.addIndex('photos', ['trial_id'], { name: 'photos_trial' });
  },
  async down({ context: q }) {
    await q.dropTable('photos');
    await q.dropTable('check_ins');
    await q.dropTable('trials');
  },
};
