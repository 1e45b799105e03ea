import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

/** The umzug context every migration receives. */
export type MigrationContext = { context: QueryInterface };

/** One migration: a name and reversible steps. */
export interface Migration {
  name: string;
  up: (p: MigrationContext) => Promise<void>;
  down: (p: MigrationContext) => Promise<void>;
}

/** created_at/updated_at columns, UTC, millisecond precision. */
export const timestamps = () => ({
  created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') },
  updated_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') },
});

export const id = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
export const userRef = (allowNull = false, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT' = allowNull ? 'SET NULL' : 'CASCADE') => ({
  type: DataTypes.UUID,
  allowNull,
  references: { model: 'users', key: 'id' },
  onDelete,
});
export const ref = (table: string, allowNull = false, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT' = allowNull ? 'SET NULL' : 'CASCADE') => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
});

export const SETTINGS = ['bin', 'flow-through', 'bed'] as const;
export const VERDICTS = ['feed', 'limit', 'prepare', 'avoid', 'unsettled'] as const;
export const PREPARATIONS = ['raw', 'chopped', 'shredded', 'frozen-thawed', 'cooked', 'soaked', 'dried', 'pre-composted', 'aged'] as const;
export const OUTCOMES = ['consumed', 'partial', 'rejected', 'harm'] as const;
export const CERTAINTY = ['high', 'moderate', 'low', 'very low'] as const;
