import 'server-only';
import { QueryTypes, Sequelize, type Options } from 'sequelize';
import { getEnv } from '@/lib/env';

/**
 * Builds a Sequelize instance for MariaDB from explicit settings. Times are
 * stored in UTC ('+00:00'), so every stored instant carries a known offset.
 */
export function createSequelize(overrides: Partial<{ host: string; port: number; database: string; username: string; password: string }> = {}): Sequelize {
  const env = getEnv();
  const base = {
    host: overrides.host ?? env.DB_HOST,
    port: overrides.port ?? env.DB_PORT,
    username: overrides.username ?? env.DB_USER,
    password: overrides.password ?? env.DB_PASSWORD,
  };
  const replicas = env.DB_READ_REPLICAS.split(',')
    .map((s) => s.trim())
    .filter(Boolean)
    .map((hp) => {
      const [host, port] = hp.split(':');
      return { host, port: Number(port || 3306), username: base.username, password: base.password };
    });
  const options: Options = {
    dialect: 'mariadb',
    database: overrides.database ?? env.DB_NAME,
    ...(replicas.length ? { replication: { write: base, read: replicas } } : base),
    timezone: '+00:00',
    logging: false,
    pool: { max: env.DB_POOL_MAX, min: 0, idle: 10_000, acquire: 15_000 },
    dialectOptions: { connectTimeout: 3_000 },
    define: { underscored: true },
  };
  return new Sequelize(options);
}

const globalForDb = globalThis as unknown as { __trialbedSequelize?: Sequelize };

/** The one Sequelize instance of the process (kept across dev reloads). */
export const sequelize: Sequelize = globalForDb.__trialbedSequelize ?? createSequelize();
globalForDb.__trialbedSequelize = sequelize;

/** Runs a raw UPDATE/DELETE and returns the number of rows it changed. */
export async function execWrite(sql: string, options: { replacements?: unknown[] | Record<string, unknown>; transaction?: import('sequelize').Transaction } = {}): Promise<number> {
  const [, affected] = (await sequelize.query(sql, { ...options, type: QueryTypes.UPDATE })) as unknown as [unknown, number];
  return Number(affected ?? 0);
}
