import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { decimal, json } from './_columns';

export const PESTS = ['land-flatworms', 'mites', 'fruit-flies', 'fungus-gnats', 'ants', 'rodents', 'springtails'] as const;
export type Pest = (typeof PESTS)[number];
export type WormActivity = 'none' | 'few' | 'many' | 'swarming';
export type Smell = 'none' | 'earthy' | 'sour' | 'rotten' | 'ammonia';
export type Moisture = 'dry' | 'damp' | 'wet' | 'waterlogged';

/** One visit to a trial: what was left, how the worms and the bed looked. */
export class CheckIn extends Model<InferAttributes<CheckIn>, InferCreationAttributes<CheckIn>> {
  declare id: CreationOptional<number>;
  declare trialId: number;
  declare authorId: string;
  declare observedOn: string;
  declare utcOffsetMinutes: CreationOptional<number>;
  declare wormActivity: WormActivity;
  declare shareRemainingPct: number;
  declare bedTempC: number | null;
  declare mould: boolean;
  declare smell: Smell;
  declare moisture: Moisture;
  declare ph: number | null;
  declare pests: Pest[];
  declare wormDeaths: boolean;
  declare exodus: boolean;
  declare notes: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

CheckIn.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    trialId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    authorId: { type: DataTypes.UUID, allowNull: false },
    observedOn: { type: DataTypes.DATEONLY, allowNull: false },
    utcOffsetMinutes: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
    wormActivity: { type: DataTypes.ENUM('none', 'few', 'many', 'swarming'), allowNull: false },
    shareRemainingPct: decimal('shareRemainingPct', 5, 2, false),
    bedTempC: decimal('bedTempC', 5, 2),
    mould: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    smell: { type: DataTypes.ENUM('none', 'earthy', 'sour', 'rotten', 'ammonia'), allowNull: false },
    moisture: { type: DataTypes.ENUM('dry', 'damp', 'wet', 'waterlogged'), allowNull: false },
    ph: decimal('ph', 4, 2),
    pests: json('pests'),
    wormDeaths: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    exodus: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'check_ins', modelName: 'checkIn', underscored: true },
);
