import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { json } from './_columns';
import type { Verdict } from './EvidenceAggregate';
import type { Setting } from './Trial';

/** A proposed published verdict for one setting. */
export interface ProposedSetting {
  setting: Setting;
  verdict: Verdict;
  ceilingKgM2: number | null;
  cautions: string[];
}

/** A verdict proposal: what should be published, why, and the trials it rests on. */
export class Proposal extends Model<InferAttributes<Proposal>, InferCreationAttributes<Proposal>> {
  declare id: CreationOptional<number>;
  declare feedstockId: number;
  declare authorId: string;
  declare baseVerdictVersion: number;
  declare settings: ProposedSetting[];
  declare rationale: string;
  declare status: CreationOptional<'open' | 'approved' | 'rejected' | 'withdrawn'>;
  declare decidedBy: CreationOptional<string | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare decisionNote: CreationOptional<string | null>;
  declare claimedBy: CreationOptional<string | null>;
  declare claimedUntil: CreationOptional<Date | null>;
  declare hiddenAt: CreationOptional<Date | null>;
  declare hiddenBy: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare isDemo: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Proposal.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    feedstockId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    authorId: { type: DataTypes.UUID, allowNull: false },
    baseVerdictVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    settings: json('settings'),
    rationale: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.ENUM('open', 'approved', 'rejected', 'withdrawn'), allowNull: false, defaultValue: 'open' },
    decidedBy: DataTypes.UUID,
    decidedAt: DataTypes.DATE(3),
    decisionNote: DataTypes.TEXT,
    claimedBy: DataTypes.UUID,
    claimedUntil: DataTypes.DATE(3),
    hiddenAt: DataTypes.DATE(3),
    hiddenBy: DataTypes.UUID,
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    isDemo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'proposals', modelName: 'proposal', underscored: true },
);

/** A trial a proposal cites. */
export class ProposalTrial extends Model<InferAttributes<ProposalTrial>, InferCreationAttributes<ProposalTrial>> {
  declare proposalId: number;
  declare trialId: number;
}

ProposalTrial.init(
  {
    proposalId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
    trialId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
  },
  { sequelize, tableName: 'proposal_trials', modelName: 'proposalTrial', underscored: true, timestamps: false },
);

/** One person's agree/disagree on a proposal, with a short reason. One per person per proposal. */
export class Vote extends Model<InferAttributes<Vote>, InferCreationAttributes<Vote>> {
  declare id: CreationOptional<number>;
  declare proposalId: number;
  declare voterId: string;
  declare agree: boolean;
  declare reason: string;
  declare hiddenAt: CreationOptional<Date | null>;
  declare hiddenBy: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Vote.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    proposalId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    voterId: { type: DataTypes.UUID, allowNull: false },
    agree: { type: DataTypes.BOOLEAN, allowNull: false },
    reason: { type: DataTypes.STRING(500), allowNull: false },
    hiddenAt: DataTypes.DATE(3),
    hiddenBy: DataTypes.UUID,
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'votes', modelName: 'vote', underscored: true },
);
