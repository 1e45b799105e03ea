import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { json } from './_columns';
import { VERDICTS, type Verdict } from './EvidenceAggregate';
import { SETTINGS, type Setting } from './Trial';

/** The verdict readers see for a feedstock in one setting; changed only by a decided proposal. */
export class PublishedVerdict extends Model<InferAttributes<PublishedVerdict>, InferCreationAttributes<PublishedVerdict>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare setting: Setting;
  declare verdict: Verdict;
  declare ceilingKgM2: number | null;
  declare cautions: string[];
  declare proposalId: number | null;
  declare publishedAt: Date;
}

PublishedVerdict.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
    verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
    ceilingKgM2: DataTypes.DOUBLE,
    cautions: json('cautions'),
    proposalId: DataTypes.INTEGER.UNSIGNED,
    publishedAt: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'published_verdicts', modelName: 'publishedVerdict', underscored: true, timestamps: false },
);

/** One published-verdict change: who decided, when, after which proposal, with the note. */
export class VerdictHistory extends Model<InferAttributes<VerdictHistory>, InferCreationAttributes<VerdictHistory>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare setting: Setting;
  declare previousVerdict: Verdict | null;
  declare verdict: Verdict;
  declare ceilingKgM2: number | null;
  declare cautions: string[];
  declare proposalId: number | null;
  declare decidedBy: string | null;
  declare note: string;
  declare decidedAt: Date;
}

VerdictHistory.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    setting: { type: DataTypes.ENUM(...SETTINGS), allowNull: false },
    previousVerdict: DataTypes.ENUM(...VERDICTS),
    verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: false },
    ceilingKgM2: DataTypes.DOUBLE,
    cautions: json('cautions'),
    proposalId: DataTypes.INTEGER.UNSIGNED,
    decidedBy: DataTypes.UUID,
    note: { type: DataTypes.TEXT, allowNull: false },
    decidedAt: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'verdict_history', modelName: 'verdictHistory', underscored: true, timestamps: false },
);
