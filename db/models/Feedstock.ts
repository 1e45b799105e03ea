import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../index';
import { decimal, json } from './_columns';

export const CATEGORIES = ['fruit', 'vegetable', 'grain-starch', 'paper-card', 'garden', 'manure', 'animal-product', 'other'] as const;
export type Category = (typeof CATEGORIES)[number];
export const HANDLING_CAUTIONS = ['manure', 'mould', 'dust', 'shredder', 'pathogens', 'rodents'] as const;
export type HandlingCaution = (typeof HANDLING_CAUTIONS)[number];

/** A feedstock (food scrap, bedding, garden waste or manure) with its wiki page. */
export class Feedstock extends Model<InferAttributes<Feedstock>, InferCreationAttributes<Feedstock>> {
  declare id: CreationOptional<number>;
  declare slug: string;
  declare name: string;
  declare category: Category;
  declare family: string | null;
  declare cnRatio: number | null;
  declare nitrogenPct: number | null;
  declare moisturePct: number | null;
  declare bulkDensityKgM3: number | null;
  declare referenceSource: string | null;
  declare summary: string;
  declare pageText: string;
  declare handlingCautions: HandlingCaution[];
  declare mergedIntoId: CreationOptional<number | null>;
  declare version: CreationOptional<number>;
  declare verdictVersion: CreationOptional<number>;
  declare isDemo: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Feedstock.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    slug: { type: DataTypes.STRING(120), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(160), allowNull: false },
    category: { type: DataTypes.ENUM(...CATEGORIES), allowNull: false },
    family: DataTypes.STRING(80),
    cnRatio: decimal('cnRatio', 8, 2),
    nitrogenPct: decimal('nitrogenPct', 6, 3),
    moisturePct: decimal('moisturePct', 5, 2),
    bulkDensityKgM3: decimal('bulkDensityKgM3', 8, 2),
    referenceSource: DataTypes.STRING(300),
    summary: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    pageText: { type: DataTypes.TEXT('medium'), allowNull: false },
    handlingCautions: json('handlingCautions'),
    mergedIntoId: DataTypes.INTEGER.UNSIGNED,
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    verdictVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    isDemo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'feedstocks', modelName: 'feedstock', underscored: true },
);
