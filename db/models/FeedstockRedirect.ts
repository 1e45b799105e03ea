import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/** An old slug left by a rename or merge; its page redirects to the feedstock. */
export class FeedstockRedirect extends Model<InferAttributes<FeedstockRedirect>, InferCreationAttributes<FeedstockRedirect>> {
  declare id: CreationOptional<number>;
  declare oldSlug: string;
  declare feedstockId: number;
}

FeedstockRedirect.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    oldSlug: { type: DataTypes.STRING(120), allowNull: false, unique: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
  },
  { sequelize, tableName: 'feedstock_redirects', modelName: 'feedstockRedirect', underscored: true },
);
