import { DataTypes } from 'sequelize';
import type { Migration } from './_shared';

/**
 * Fixed-window rate-limit counters shared by every app server (sign-in mail
 * per address and per client). Keys hold a hash, never the address itself.
 */
export const migration: Migration = {
  name: '20261202-0101-rate-limits',
  async up({ context: q }) {
    await q.createTable('rate_limits', {
      bucket: { type: DataTypes.STRING(191), primaryKey: true },
      window_start: { type: DataTypes.DATE(3), allowNull: false },
      hits: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      expires_at: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('rate_limits', ['expires_at'], { name: 'rate_limits_expires' });
  },
  async down({ context: q }) {
    await q.dropTable('rate_limits');
  },
};
