import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';

export const ROLES = ['reader', 'contributor', 'editor', 'moderator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** A person with an account. Auth.js reads and writes it through the adapter; `role` is ours. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare name: string | null;
  declare email: string | null;
  declare emailVerified: Date | null;
  declare image: CreationOptional<string | null>;
  declare role: CreationOptional<Role>;
  declare units: CreationOptional<'metric' | 'imperial'>;
  declare region: CreationOptional<string | null>;
  declare licenceAcceptedAt: CreationOptional<Date | null>;
  declare disabledAt: CreationOptional<Date | null>;
  declare isDemo: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

User.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    name: DataTypes.STRING(120),
    email: { type: DataTypes.STRING(254), unique: true },
    emailVerified: DataTypes.DATE(3),
    image: DataTypes.STRING(500),
    role: { type: DataTypes.ENUM(...ROLES), allowNull: false, defaultValue: 'reader' },
    units: { type: DataTypes.ENUM('metric', 'imperial'), allowNull: false, defaultValue: 'metric' },
    region: DataTypes.STRING(80),
    licenceAcceptedAt: DataTypes.DATE(3),
    disabledAt: DataTypes.DATE(3),
    isDemo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'users', modelName: 'user', underscored: true },
);
