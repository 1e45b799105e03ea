import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/** A reader's request for a feedstock the site does not have yet; listed for editors. */
export class FeedstockRequest extends Model<InferAttributes<FeedstockRequest>, InferCreationAttributes<FeedstockRequest>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare note: string | null;
  declare requesterId: string | null;
  declare status: CreationOptional<'open' | 'added' | 'declined'>;
  declare feedstockId: CreationOptional<number | null>;
  declare isDemo: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

FeedstockRequest.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(160), allowNull: false },
    note: DataTypes.TEXT,
    requesterId: DataTypes.UUID,
    status: { type: DataTypes.ENUM('open', 'added', 'declined'), allowNull: false, defaultValue: 'open' },
    feedstockId: DataTypes.INTEGER.UNSIGNED,
    isDemo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'feedstock_requests', modelName: 'feedstockRequest', underscored: true },
);
