import { SequelizeStorage, Umzug } from 'umzug';
import type { Database } from './database';
import { migrations } from './migrations';

/** Brings the schema up to date; migrations own the schema, never `sync()`. */
export async function migrateToLatest(database: Database): Promise<string[]> {
  const umzug = new Umzug({
    migrations: migrations.map((migration) => ({
      name: migration.name,
      up: () => migration.up(database.sequelize.getQueryInterface(), database.dialect),
      down: () => migration.down(database.sequelize.getQueryInterface(), database.dialect),
    })),
    context: database.sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize: database.sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
  const applied = await umzug.up();
  return applied.map((migration) => migration.name);
}
