import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/** One version of a feedstock's page text: published, or waiting for an editor's review. */
export class FeedstockRevision extends Model<InferAttributes<FeedstockRevision>, InferCreationAttributes<FeedstockRevision>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare authorId: string | null;
  declare body: string;
  declare editSummary: CreationOptional<string>;
  declare status: 'pending' | 'published' | 'rejected';
  declare baseVersion: number;
  declare reviewerId: CreationOptional<string | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare reviewNote: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

FeedstockRevision.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    authorId: DataTypes.UUID,
    body: { type: DataTypes.TEXT('medium'), allowNull: false },
    editSummary: { type: DataTypes.STRING(255), allowNull: false, defaultValue: '' },
    status: { type: DataTypes.ENUM('pending', 'published', 'rejected'), allowNull: false },
    baseVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    reviewerId: DataTypes.UUID,
    reviewedAt: DataTypes.DATE(3),
    reviewNote: DataTypes.TEXT,
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'feedstock_revisions', modelName: 'feedstockRevision', underscored: true },
);
