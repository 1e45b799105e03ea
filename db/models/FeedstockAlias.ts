import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/** Another name a feedstock goes by ("orange rind" for orange peel); unique across all feedstocks. */
export class FeedstockAlias extends Model<InferAttributes<FeedstockAlias>, InferCreationAttributes<FeedstockAlias>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare alias: string;
}

FeedstockAlias.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    alias: { type: DataTypes.STRING(160), allowNull: false, unique: true },
  },
  { sequelize, tableName: 'feedstock_aliases', modelName: 'feedstockAlias', underscored: true },
);
