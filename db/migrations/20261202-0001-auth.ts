import { DataTypes } from 'sequelize';
import { timestamps, type Migration } from './_shared';

/** Auth.js adapter tables (users, accounts, sessions, verification tokens) with our role column. */
export const migration: Migration = {
  name: '20261202-0001-auth',
  async up({ context: q }) {
    await q.createTable('users', {
      id: { type: DataTypes.UUID, primaryKey: true },
      name: { type: DataTypes.STRING(120), allowNull: true },
      email: { type: DataTypes.STRING(254), allowNull: true, unique: true },
      email_verified: { type: DataTypes.DATE(3), allowNull: true },
      image: { type: DataTypes.STRING(500), allowNull: true },
      role: {
        type: DataTypes.ENUM('reader', 'contributor', 'editor', 'moderator', 'admin'),
        allowNull: false,
        defaultValue: 'reader',
      },
      units: { type: DataTypes.ENUM('metric', 'imperial'), allowNull: false, defaultValue: 'metric' },
      region: { type: DataTypes.STRING(80), allowNull: true },
      licence_accepted_at: { type: DataTypes.DATE(3), allowNull: true },
      disabled_at: { type: DataTypes.DATE(3), allowNull: true },
      is_demo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...timestamps(),
    });
    await q.createTable('accounts', {
      id: { type: DataTypes.UUID, primaryKey: true },
      user_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      type: { type: DataTypes.STRING(40), allowNull: false },
      provider: { type: DataTypes.STRING(60), allowNull: false },
      provider_account_id: { type: DataTypes.STRING(191), allowNull: false },
      refresh_token: { type: DataTypes.TEXT, allowNull: true },
      access_token: { type: DataTypes.TEXT, allowNull: true },
      expires_at: { type: DataTypes.INTEGER, allowNull: true },
      token_type: { type: DataTypes.STRING(40), allowNull: true },
      scope: { type: DataTypes.STRING(255), allowNull: true },
      id_token: { type: DataTypes.TEXT, allowNull: true },
      session_state: { type: DataTypes.STRING(255), allowNull: true },
    });
    await q.addIndex('accounts', ['provider', 'provider_account_id'], { unique: true, name: 'accounts_provider_account' });
    await q.createTable('sessions', {
      id: { type: DataTypes.UUID, primaryKey: true },
      session_token: { type: DataTypes.STRING(191), allowNull: false, unique: true },
      user_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      expires: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.createTable('verification_tokens', {
      token: { type: DataTypes.STRING(191), primaryKey: true },
      identifier: { type: DataTypes.STRING(254), allowNull: false },
      expires: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('verification_tokens', ['identifier'], { name: 'verification_tokens_identifier' });
  },
  async down({ context: q }) {
    await q.dropTable('verification_tokens');
    await q.dropTable('sessions');
    await q.dropTable('accounts');
    await q.dropTable('users');
  },
};
