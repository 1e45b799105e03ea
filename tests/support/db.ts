import { randomUUID } from 'node:crypto';
import { Sequelize } from 'sequelize';

/** Settings of the throwaway MariaDB that `npm test` started (from the environment). */
export function testDbSettings() {
  const { DB_HOST = '127.0.0.1', DB_PORT, DB_NAME, DB_USER, DB_PASSWORD = '' } = process.env;
  if (!DB_PORT || !DB_NAME || !DB_USER) throw new Error('run the tests through `npm test` (it starts the database)');
  return { host: DB_HOST, port: Number(DB_PORT), database: DB_NAME, username: DB_USER, password: DB_PASSWORD };
}

/** A connection to a scratch database created for one test file; dropped by `drop()`. */
export async function createScratchDatabase(prefix = 'scratch'): Promise<{ sequelize: Sequelize; name: string; drop: () => Promise<void> }> {
  const s = testDbSettings();
  const name = `${prefix}_${randomUUID().replace(/-/g, '').slice(0, 12)}`;
  const admin = new Sequelize({ dialect: 'mariadb', host: s.host, port: s.port, username: s.username, password: s.password, logging: false });
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.close();
  const sequelize = new Sequelize({
    dialect: 'mariadb',
    host: s.host,
    port: s.port,
    database: name,
    username: s.username,
    password: s.password,
    logging: false,
    timezone: '+00:00',
    define: { underscored: true },
  });
  return {
    sequelize,
    name,
    drop: async () => {
      await sequelize.query(`DROP DATABASE IF EXISTS \`${name}\``);
      await sequelize.close();
    },
  };
}
