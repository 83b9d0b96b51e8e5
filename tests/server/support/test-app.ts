import type { Express } from 'express';
import { Sequelize } from 'sequelize';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createApp } from '../../../server/app';
import { openDatabase, type Database } from '../../../server/db/database';
import { migrateToLatest } from '../../../server/db/migrator';
import { initModels } from '../../../server/db/models';
import { seedDemo } from '../../../server/demo/seed-demo';
import { loadConfig, type Config } from '../../../server/lib/config';
import { createLogger } from '../../../server/lib/logger';

/** An app on its own fresh SQLite file, for one test file. */
export interface TestApp {
  readonly app: Express;
  readonly database: Database;
  readonly config: Config;
  readonly dataDir: string;
  close(): Promise<void>;
}

/**
 * Builds the real app over a new temporary database (migrated, and seeded with the demo scenario
 * unless `withDemo` is false). That is a SQLite file, or — when TEST_DATABASE_URL names a
 * PostgreSQL server — a fresh database created on it for this app and dropped at close.
 * Extra environment variables go through the real config.
 */
export async function createTestApp({ withDemo = true, env = {} }: { withDemo?: boolean; env?: Record<string, string> } = {}): Promise<TestApp> {
  const dataDir = mkdtempSync(join(tmpdir(), 'heapsight-test-'));
  const postgres = process.env['TEST_DATABASE_URL'] ? await createPostgresDatabase(process.env['TEST_DATABASE_URL']) : null;
  const config = loadConfig({
    NODE_ENV: 'test', DATA_DIR: dataDir, LOG_LEVEL: 'silent', STATIC_DIR: join(dataDir, 'no-static'),
    JWT_SECRET: 'test-secret-that-is-long-enough-for-hs256-signing',
    ...(postgres ? { DATABASE_URL: postgres.url } : {}),
    ...env,
  });
  const database = await openDatabase(config);
  initModels(database.sequelize);
  await migrateToLatest(database);
  if (withDemo) {
    await seedDemo(database);
  }
  const app = createApp({ config, database, logger: createLogger('silent') });
  return {
    app,
    database,
    config,
    dataDir,
    async close() {
      await database.close();
      await postgres?.drop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** Makes an empty database on the test PostgreSQL server, named at random so test files never meet. */
async function createPostgresDatabase(adminUrl: string): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `hs_test_${randomBytes(6).toString('hex')}`;
  const admin = new Sequelize(adminUrl, { dialect: 'postgres', logging: false });
  await admin.query(`CREATE DATABASE ${name}`);
  await admin.close();
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    async drop() {
      const dropper = new Sequelize(adminUrl, { dialect: 'postgres', logging: false });
      await dropper.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await dropper.close();
    },
  };
}
