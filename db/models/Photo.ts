import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/** A re-encoded photo (metadata stripped) of a trial or check-in, kept in the storage backend. */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<number>;
  declare trialId: number;
  declare checkInId: number | null;
  declare uploaderId: string;
  declare storageKey: string;
  declare thumbKey: string;
  declare contentType: string;
  declare width: number;
  declare height: number;
  declare bytes: number;
  declare caption: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Photo.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    trialId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    checkInId: DataTypes.INTEGER.UNSIGNED,
    uploaderId: { type: DataTypes.UUID, allowNull: false },
    storageKey: { type: DataTypes.STRING(255), allowNull: false, unique: true },
    thumbKey: { type: DataTypes.STRING(255), allowNull: false },
    contentType: { type: DataTypes.STRING(40), allowNull: false },
    width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'photos', modelName: 'photo', underscored: true },
);
