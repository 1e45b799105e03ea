import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { decimal } from './_columns';

export const SETTINGS = ['bin', 'flow-through', 'bed'] as const;
export type Setting = (typeof SETTINGS)[number];
export const PREPARATIONS = ['raw', 'chopped', 'shredded', 'frozen-thawed', 'cooked', 'soaked', 'dried', 'pre-composted', 'aged'] as const;
export type Preparation = (typeof PREPARATIONS)[number];
export const OUTCOMES = ['consumed', 'partial', 'rejected', 'harm'] as const;
export type Outcome = (typeof OUTCOMES)[number];
export const SPECIES = ['eisenia-fetida', 'eisenia-andrei', 'perionyx-excavatus', 'eudrilus-eugeniae', 'mixed-unknown'] as const;
export type Species = (typeof SPECIES)[number];
export const PROVENANCES = ['home-grown', 'store-bought', 'commercial-scrap'] as const;
export type Provenance = (typeof PROVENANCES)[number];
export type TrialStatus = 'running' | 'closed' | 'abandoned';

/** A feeding trial: a measured dose of one feedstock in one bed or bin, followed by check-ins. */
export class Trial extends Model<InferAttributes<Trial>, InferCreationAttributes<Trial>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare ownerId: string;
  declare setting: Setting;
  declare preparation: Preparation;
  declare provenance: Provenance;
  declare surfaceAreaM2: number;
  declare bedDepthCm: number | null;
  declare species: Species;
  declare wormMassKg: number | null;
  declare doseAmount: number;
  declare doseUnit: string;
  declare doseKg: number;
  declare surfaceLoadKgM2: number;
  declare layerDepthCm: number | null;
  declare feedRatio: number | null;
  declare pairedTrialId: CreationOptional<number | null>;
  declare isControl: CreationOptional<boolean>;
  declare region: string;
  declare startDate: string;
  declare checkInEveryDays: CreationOptional<number>;
  declare status: CreationOptional<TrialStatus>;
  declare proposedOutcome: CreationOptional<Outcome | null>;
  declare confirmedOutcome: CreationOptional<Outcome | null>;
  declare closeReason: CreationOptional<string | null>;
  declare closedAt: CreationOptional<Date | null>;
  declare notes: string;
  declare version: CreationOptional<number>;
  declare isDemo: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Trial.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    ownerId: { type: DataTypes.UUID, allowNull: false },
    setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
    preparation: { type: DataTypes.ENUM(...PREPARATIONS), allowNull: false },
    provenance: { type: DataTypes.ENUM(...PROVENANCES), allowNull: false },
    surfaceAreaM2: decimal('surfaceAreaM2', 10, 4, false),
    bedDepthCm: decimal('bedDepthCm', 7, 2),
    species: { type: DataTypes.ENUM(...SPECIES), allowNull: false },
    wormMassKg: decimal('wormMassKg', 10, 4),
    doseAmount: decimal('doseAmount', 12, 4, false),
    doseUnit: { type: DataTypes.STRING(8), allowNull: false },
    doseKg: decimal('doseKg', 14, 6, false),
    surfaceLoadKgM2: decimal('surfaceLoadKgM2', 14, 6, false),
    layerDepthCm: decimal('layerDepthCm', 7, 2),
    feedRatio: decimal('feedRatio', 14, 6),
    pairedTrialId: DataTypes.INTEGER.UNSIGNED,
    isControl: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    region: { type: DataTypes.STRING(80), allowNull: false },
    startDate: { type: DataTypes.DATEONLY, allowNull: false },
    checkInEveryDays: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 7 },
    status: { type: DataTypes.ENUM('running', 'closed', 'abandoned'), allowNull: false, defaultValue: 'running' },
    proposedOutcome: DataTypes.ENUM(...OUTCOMES),
    confirmedOutcome: DataTypes.ENUM(...OUTCOMES),
    closeReason: DataTypes.TEXT,
    closedAt: DataTypes.DATE(3),
    notes: { type: DataTypes.TEXT, allowNull: false },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    isDemo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'trials', modelName: 'trial', underscored: true },
);
