import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { json } from './_columns';

/** A mail to send, written in the same transaction as the change that caused it. */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>;
  declare kind: string;
  declare recipient: string;
  declare subscriptionId: number | null;
  declare feedstockId: number | null;
  declare payload: Record<string, unknown>;
  declare dedupeKey: string | null;
  declare status: CreationOptional<'pending' | 'sending' | 'sent' | 'failed' | 'digest'>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare lockedUntil: CreationOptional<Date | null>;
  declare lastError: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

OutboxMessage.init(
  {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    recipient: { type: DataTypes.STRING(254), allowNull: false },
    subscriptionId: DataTypes.INTEGER.UNSIGNED,
    feedstockId: DataTypes.INTEGER.UNSIGNED,
    payload: json('payload'),
    dedupeKey: { type: DataTypes.STRING(191), unique: true },
    status: { type: DataTypes.ENUM('pending', 'sending', 'sent', 'failed', 'digest'), allowNull: false, defaultValue: 'pending' },
    attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
    nextAttemptAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    lockedUntil: DataTypes.DATE(3),
    lastError: DataTypes.TEXT,
    sentAt: DataTypes.DATE(3),
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'outbox', modelName: 'outboxMessage', underscored: true },
);
