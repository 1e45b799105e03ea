import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

/** A database session of Auth.js (the cookie holds only its token). */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare id: CreationOptional<string>;
  declare sessionToken: string;
  declare userId: string;
  declare expires: Date;
}

Session.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    sessionToken: { type: DataTypes.STRING(191), allowNull: false, unique: true },
    userId: { type: DataTypes.UUID, allowNull: false },
    expires: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'sessions', modelName: 'session', underscored: true, timestamps: false },
);
