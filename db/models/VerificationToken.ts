import { DataTypes, Model } from 'sequelize';
import { sequelize } from '../index';

/** A one-time e-mail sign-in token of Auth.js (stored hashed by Auth.js). */
export class VerificationToken extends Model {}

VerificationToken.init(
  {
    token: { type: DataTypes.STRING(191), primaryKey: true },
    identifier: { type: DataTypes.STRING(254), allowNull: false },
    expires: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'verification_tokens', modelName: 'verificationToken', underscored: true, timestamps: false },
);
