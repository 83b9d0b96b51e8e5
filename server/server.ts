import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import { openDatabase, type Database } from './db/database';
import { migrateToLatest } from './db/migrator';
import { initModels } from './db/models';
import { seedDemo } from './demo/seed-demo';
import { ensureDataDir, type Config } from './lib/config';
import { createLogger } from './lib/logger';

/** A running Heapsight server: its URL and the way to stop it cleanly. */
export interface RunningServer {
  readonly url: string;
  readonly database: Database;
  stop(): Promise<void>;
}

/** Opens the database, migrates, seeds the demo when asked, and listens. */
export async function startServer(config: Config): Promise<RunningServer> {
  const logger = createLogger(config.logLevel);
  ensureDataDir(config);
  const database = await openDatabase(config);
  initModels(database.sequelize);
  const applied = await migrateToLatest(database);
  if (applied.length > 0) {
    logger.info({ applied }, 'migrations applied');
  }
  if (config.isDemo) {
    const { isNew } = await seedDemo(database);
    logger.info({ isNew }, 'demo scenario ready');
  }

  const app = createApp({ config, database, logger });
  const server: Server = await new Promise((resolve) => {
    const listening = app.listen(config.port, config.host, () => resolve(listening));
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${config.host === '0.0.0.0' ? '127.0.0.1' : config.host}:${port}`;

  return {
    url,
    database,
    async stop() {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      });
      await database.close();
    },
  };
}
