import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/**
 * A reader following a feedstock (or the whole site when feedstockId is null)
 * by mail. It counts only once confirmed (confirmedAt set, unsubscribedAt
 * null); only a SHA-256 hash of the confirmation token is stored.
 */
export class Subscription extends Model<InferAttributes<Subscription>, InferCreationAttributes<Subscription>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number | null;
  declare userId: string | null;
  declare email: string;
  declare mode: CreationOptional<'immediate' | 'digest'>;
  declare confirmedAt: CreationOptional<Date | null>;
  declare confirmTokenHash: CreationOptional<string | null>;
  /** When the confirmation link was mailed; links expire (lib/services/subscriptions.ts). */
  declare confirmSentAt: CreationOptional<Date | null>;
  declare unsubscribedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Subscription.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: DataTypes.INTEGER.UNSIGNED,
    userId: DataTypes.UUID,
    email: { type: DataTypes.STRING(254), allowNull: false },
    mode: { type: DataTypes.ENUM('immediate', 'digest'), allowNull: false, defaultValue: 'immediate' },
    confirmedAt: DataTypes.DATE(3),
    confirmTokenHash: DataTypes.STRING(64),
    confirmSentAt: DataTypes.DATE(3),
    unsubscribedAt: DataTypes.DATE(3),
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'subscriptions', modelName: 'subscription', underscored: true },
);
