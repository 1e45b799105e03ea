import { DataTypes, Model } from 'sequelize';
import { sequelize } from '../index';

/** An Auth.js linked account (kept for providers other than e-mail). */
export class Account extends Model {}

Account.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    type: { type: DataTypes.STRING(40), allowNull: false },
    provider: { type: DataTypes.STRING(60), allowNull: false },
    providerAccountId: { type: DataTypes.STRING(191), allowNull: false },
    refresh_token: DataTypes.TEXT,
    access_token: DataTypes.TEXT,
    expires_at: DataTypes.INTEGER,
    token_type: DataTypes.STRING(40),
    scope: DataTypes.STRING(255),
    id_token: DataTypes.TEXT,
    session_state: DataTypes.STRING(255),
    userId: { type: DataTypes.UUID, allowNull: false },
  },
  { sequelize, tableName: 'accounts', modelName: 'account', underscored: true, timestamps: false },
);
