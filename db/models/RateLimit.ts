import { DataTypes, Model, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/** One fixed-window counter (e.g. sign-in mails to one hashed address this hour); see lib/services/rate-limits.ts. */
export class RateLimit extends Model<InferAttributes<RateLimit>, InferCreationAttributes<RateLimit>> {
  declare bucket: string;
  declare windowStart: Date;
  declare hits: number;
  declare expiresAt: Date;
}

RateLimit.init(
  {
    bucket: { type: DataTypes.STRING(191), primaryKey: true },
    windowStart: { type: DataTypes.DATE(3), allowNull: false },
    hits: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    expiresAt: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'rate_limits', modelName: 'rateLimit', underscored: true, timestamps: false },
);
