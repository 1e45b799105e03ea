import { DataTypes } from 'sequelize';
import type { Migration } from './_shared';

/**
 * Mail delivery (issue 8): double opt-in, one subscription per address and
 * scope, weekly digests folded into one outbox row.
 *
 * - subscriptions.confirm_sent_at: when the confirmation link was mailed (links expire).
 * - subscriptions.scope_key: a stored generated column (feedstock id, 0 for the whole
 *   site) with a unique key on (scope_key, email). The existing unique key on
 *   (feedstock_id, email) lets any number of NULL rows through, so whole-site
 *   subscriptions could be doubled by two quick clicks; this one cannot.
 * - subscriptions: index on confirm_token_hash (confirmation looks rows up by it).
 * - outbox.status gains 'digested' (a digest row folded into the weekly digest mail
 *   that outbox.digest_id points at) and 'cancelled' (the reader unsubscribed
 *   before it went out).
 */
export const migration: Migration = {
  name: '20261202-0801-mail-delivery',
  async up({ context: q }) {
    await q.addColumn('subscriptions', 'confirm_sent_at', { type: DataTypes.DATE(3), allowNull: true });
    await q.sequelize.query(
      'ALTER TABLE subscriptions ADD COLUMN scope_key INT UNSIGNED AS (IFNULL(feedstock_id, 0)) PERSISTENT',
    );
    await q.addIndex('subscriptions', ['scope_key', 'email'], { unique: true, name: 'subscriptions_scope_email' });
    await q.addIndex('subscriptions', ['confirm_token_hash'], { name: 'subscriptions_confirm_token' });
    await q.sequelize.query(
      "ALTER TABLE outbox MODIFY status ENUM('pending','sending','sent','failed','digest','digested','cancelled') NOT NULL DEFAULT 'pending'",
    );
    await q.addColumn('outbox', 'digest_id', {
      type: DataTypes.BIGINT.UNSIGNED,
      allowNull: true,
      references: { model: 'outbox', key: 'id' },
      onDelete: 'SET NULL',
    });
    await q.addIndex('outbox', ['recipient', 'status'], { name: 'outbox_recipient_status' });
  },
  async down({ context: q }) {
    await q.removeIndex('outbox', 'outbox_recipient_status');
    // The foreign key on digest_id goes with its column.
    const [fks] = (await q.sequelize.query(
      "SELECT constraint_name AS name FROM information_schema.key_column_usage WHERE table_schema = DATABASE() AND table_name = 'outbox' AND column_name = 'digest_id' AND referenced_table_name IS NOT NULL",
    )) as [{ name: string }[], unknown];
    for (const fk of fks) await q.sequelize.query(`ALTER TABLE outbox DROP FOREIGN KEY \`${fk.name}\``);
    await q.removeColumn('outbox', 'digest_id');
    await q.sequelize.query("UPDATE outbox SET status = 'sent' WHERE status = 'digested'");
    await q.sequelize.query("UPDATE outbox SET status = 'failed' WHERE status = 'cancelled'");
    await q.sequelize.query(
      "ALTER TABLE outbox MODIFY status ENUM('pending','sending','sent','failed','digest') NOT NULL DEFAULT 'pending'",
    );
    await q.removeIndex('subscriptions', 'subscriptions_confirm_token');
    await q.removeIndex('subscriptions', 'subscriptions_scope_email');
    await q.sequelize.query('ALTER TABLE subscriptions DROP COLUMN scope_key');
    await q.removeColumn('subscriptions', 'confirm_sent_at');
  },
};
