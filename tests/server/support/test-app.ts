import type { Express } from 'express';
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
 * Builds the real app over a new temporary SQLite database (migrated, and seeded with the demo
 * scenario unless `withDemo` is false). Extra environment variables go through the real config.
 */
export async function createTestApp({ withDemo = true, env = {} }: { withDemo?: boolean; env?: Record<string, string> } = {}): Promise<TestApp> {
  const dataDir = mkdtempSync(join(tmpdir(), 'heapsight-test-'));
  const config = loadConfig({
    NODE_ENV: 'test', DATA_DIR: dataDir, LOG_LEVEL: 'silent', STATIC_DIR: join(dataDir, 'no-static'),
    JWT_SECRET: 'test-secret-that-is-long-enough-for-hs256-signing', ...env,
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
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}
