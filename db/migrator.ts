import { Umzug, SequelizeStorage } from 'umzug';
import type { Sequelize } from 'sequelize';
import { MIGRATIONS } from './migrations';

/**
 * An umzug migrator over the given connection. Applied migrations are recorded
 * in the `schema_migrations` table. Never `sync()`: the schema comes only from here.
 */
export function createMigrator(sequelize: Sequelize, logger: Pick<Console, 'info' | 'warn' | 'error' | 'debug'> | undefined = undefined) {
  return new Umzug({
    migrations: MIGRATIONS.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger,
  });
}
