import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { json } from './_columns';

/**
 * Where an outbox row is: 'pending' (due at next_attempt_at), 'sending'
 * (claimed by a worker until locked_until), 'sent', 'failed' (gave up),
 * 'digest' (waits for the weekly digest), 'digested' (folded into digest_id),
 * 'cancelled' (the reader unsubscribed before it went out).
 */
export const OUTBOX_STATUSES = ['pending', 'sending', 'sent', 'failed', 'digest', 'digested', 'cancelled'] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];

/** A mail to send, written in the same transaction as the change that caused it. */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>;
  declare kind: string;
  declare recipient: string;
  declare subscriptionId: number | null;
  declare feedstockId: number | null;
  declare payload: Record<string, unknown>;
  declare dedupeKey: string | null;
  declare status: CreationOptional<OutboxStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare lockedUntil: CreationOptional<Date | null>;
  declare lastError: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  /** For a 'digested' row: the weekly digest mail (another outbox row) that carried it. */
  declare digestId: CreationOptional<number | null>;
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
    status: { type: DataTypes.ENUM(...OUTBOX_STATUSES), allowNull: false, defaultValue: 'pending' },
    attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
    nextAttemptAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    lockedUntil: DataTypes.DATE(3),
    lastError: DataTypes.TEXT,
    sentAt: DataTypes.DATE(3),
    digestId: DataTypes.BIGINT.UNSIGNED,
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'outbox', modelName: 'outboxMessage', underscored: true },
);
