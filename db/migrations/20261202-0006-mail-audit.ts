import { DataTypes, Sequelize } from 'sequelize';
import { id, ref, timestamps, userRef, type Migration } from './_shared';

/** Subscriptions, the mail outbox, the audit log and app metadata (e.g. when the demo was loaded). */
export const migration: Migration = {
  name: '20261202-0006-mail-audit',
  async up({ context: q }) {
    await q.createTable('subscriptions', {
      id: id(),
      /** Null: the whole site. */
      feedstock_id: ref('feedstocks', true, 'CASCADE'),
      user_id: userRef(true, 'CASCADE'),
      email: { type: DataTypes.STRING(254), allowNull: false },
      mode: { type: DataTypes.ENUM('immediate', 'digest'), allowNull: false, defaultValue: 'immediate' },
      confirmed_at: { type: DataTypes.DATE(3), allowNull: true },
      confirm_token_hash: { type: DataTypes.STRING(64), allowNull: true },
      unsubscribed_at: { type: DataTypes.DATE(3), allowNull: true },
      ...timestamps(),
    });
    await q.addIndex('subscriptions', ['feedstock_id', 'email'], { unique: true, name: 'subscriptions_feedstock_email' });
    await q.createTable('outbox', {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      kind: { type: DataTypes.STRING(40), allowNull: false },
      recipient: { type: DataTypes.STRING(254), allowNull: false },
      subscription_id: ref('subscriptions', true),
      feedstock_id: ref('feedstocks', true),
      payload: { type: DataTypes.JSON, allowNull: false },
      /** The same event never queues the same mail twice. */
      dedupe_key: { type: DataTypes.STRING(191), allowNull: true, unique: true },
      status: { type: DataTypes.ENUM('pending', 'sending', 'sent', 'failed', 'digest'), allowNull: false, defaultValue: 'pending' },
      attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
      next_attempt_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') },
      locked_until: { type: DataTypes.DATE(3), allowNull: true },
      last_error: { type: DataTypes.TEXT, allowNull: true },
      sent_at: { type: DataTypes.DATE(3), allowNull: true },
      ...timestamps(),
    });
    await q.addIndex('outbox', ['status', 'next_attempt_at'], { name: 'outbox_due' });
    await q.createTable('audit_log', {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      actor_id: userRef(true),
      action: { type: DataTypes.STRING(60), allowNull: false },
      subject_type: { type: DataTypes.STRING(40), allowNull: false },
      subject_id: { type: DataTypes.STRING(64), allowNull: false },
      details: { type: DataTypes.JSON, allowNull: false },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') },
    });
    await q.addIndex('audit_log', ['subject_type', 'subject_id'], { name: 'audit_log_subject' });
    await q.createTable('app_meta', {
      key: { type: DataTypes.STRING(64), primaryKey: true },
      value: { type: DataTypes.TEXT, allowNull: false },
      updated_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') },
    });
  },
  async down({ context: q }) {
    await q.dropTable('app_meta');
    await q.dropTable('audit_log');
    await q.dropTable('outbox');
    await q.dropTable('subscriptions');
  },
};
