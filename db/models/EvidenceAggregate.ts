import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { json } from './_columns';
import { PREPARATIONS, SETTINGS, type Preparation, type Setting } from './Trial';

export const VERDICTS = ['feed', 'limit', 'prepare', 'avoid', 'unsettled'] as const;
export type Verdict = (typeof VERDICTS)[number];
export const CERTAINTY = ['high', 'moderate', 'low', 'very low'] as const;
export type Certainty = (typeof CERTAINTY)[number];

/** The engine's result for one feedstock × setting × preparation (derived; rebuilt by recompute). */
export class EvidenceAggregate extends Model<InferAttributes<EvidenceAggregate>, InferCreationAttributes<EvidenceAggregate>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare setting: Setting;
  declare preparation: Preparation;
  declare verdict: Verdict;
  declare certainty: Certainty;
  declare trialCount: number;
  declare finishedCount: number;
  declare contributorCount: number;
  declare successRate: number | null;
  declare wilsonLow: number | null;
  declare wilsonHigh: number | null;
  declare harmRate: number | null;
  declare ceilingKgM2: number | null;
  declare medianDays: number | null;
  declare medianDaysLow: number | null;
  declare medianDaysHigh: number | null;
  declare result: unknown;
  declare rulesVersion: string;
  declare computedAt: Date;
}

EvidenceAggregate.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
    preparation: { type: DataTypes.ENUM(...PREPARATIONS), allowNull: false },
    verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
    certainty: { type: DataTypes.ENUM(...CERTAINTY), allowNull: false },
    trialCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    finishedCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    contributorCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    successRate: DataTypes.DOUBLE,
    wilsonLow: DataTypes.DOUBLE,
    wilsonHigh: DataTypes.DOUBLE,
    harmRate: DataTypes.DOUBLE,
    ceilingKgM2: DataTypes.DOUBLE,
    medianDays: DataTypes.DOUBLE,
    medianDaysLow: DataTypes.DOUBLE,
    medianDaysHigh: DataTypes.DOUBLE,
    result: json('result'),
    rulesVersion: { type: DataTypes.STRING(40), allowNull: false },
    computedAt: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'evidence_aggregates', modelName: 'evidenceAggregate', underscored: true, timestamps: false },
);

/** The engine's verdict for one feedstock in one setting, combining its preparations. */
export class EvidenceVerdict extends Model<InferAttributes<EvidenceVerdict>, InferCreationAttributes<EvidenceVerdict>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare setting: Setting;
  declare verdict: Verdict;
  declare certainty: Certainty;
  declare ceilingKgM2: number | null;
  declare trialCount: number;
  declare result: unknown;
  declare rulesVersion: string;
  declare computedAt: Date;
}

EvidenceVerdict.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
    verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
    certainty: { type: DataTypes.ENUM(...CERTAINTY), allowNull: false },
    ceilingKgM2: DataTypes.DOUBLE,
    trialCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    result: json('result'),
    rulesVersion: { type: DataTypes.STRING(40), allowNull: false },
    computedAt: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'evidence_verdicts', modelName: 'evidenceVerdict', underscored: true, timestamps: false },
);
