import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { json } from './_columns';

/** An append-only record of a privileged action (role change, moderation, decision). */
export class AuditLog extends Model<InferAttributes<AuditLog>, InferCreationAttributes<AuditLog>> {
  declare id: CreationOptional<number>;
  declare actorId: string | null;
  declare action: string;
  declare subjectType: string;
  declare subjectId: string;
  declare details: Record<string, unknown>;
  declare createdAt: CreationOptional<Date>;
}

AuditLog.init(
  {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    actorId: DataTypes.UUID,
    action: { type: DataTypes.STRING(60), allowNull: false },
    subjectType: { type: DataTypes.STRING(40), allowNull: false },
    subjectId: { type: DataTypes.STRING(64), allowNull: false },
    details: json('details'),
    createdAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'audit_log', modelName: 'auditLog', underscored: true, updatedAt: false },
);

/** Small key/value facts about this installation (e.g. when the demo scenario was loaded). */
export class AppMeta extends Model<InferAttributes<AppMeta>, InferCreationAttributes<AppMeta>> {
  declare key: string;
  declare value: string;
  declare updatedAt: CreationOptional<Date>;
}

AppMeta.init(
  {
    key: { type: DataTypes.STRING(64), primaryKey: true },
    value: { type: DataTypes.TEXT, allowNull: false },
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'app_meta', modelName: 'appMeta', underscored: true, createdAt: false },
);
