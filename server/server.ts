import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { resolveJwtSecret } from './accounts/jwt-secret';
import { createApp } from './app';
import { openDatabase, type Database } from './db/database';
import { migrateToLatest } from './db/migrator';
import { initModels } from './db/models';
import { seedDemo } from './demo/seed-demo';
import { ensureDataDir, type Config } from './lib/config';
import { createLogger } from './lib/logger';
import { startFakeSmtpServer, type FakeSmtpServer } from './mail/fake-smtp-server';

/** A running Heapsight server: its URL and the way to stop it cleanly. */
export interface RunningServer {
  readonly url: string;
  readonly database: Database;
  stop(): Promise<void>;
}

/**
 * Opens the database, migrates, seeds the demo when asked, and listens. In demo mode, unless a real
 * SMTP host is configured, a local fake SMTP server receives the mail and keeps it in DATA_DIR/mail.
 */
export async function startServer(startConfig: Config): Promise<RunningServer> {
  const logger = createLogger(startConfig.logLevel);
  ensureDataDir(startConfig);
  const jwtSecret = resolveJwtSecret(startConfig);
  let fakeSmtp: FakeSmtpServer | null = null;
  if (startConfig.isDemo && !startConfig.smtp.host) {
    fakeSmtp = await startFakeSmtpServer({ mailDir: join(startConfig.dataDir, 'mail') });
    logger.info({ port: fakeSmtp.port }, 'fake SMTP server listening');
  }
  const database = await openDatabase(startConfig);
  initModels(database.sequelize);
  const applied = await migrateToLatest(database);
  if (applied.length > 0) {
    logger.info({ applied }, 'migrations applied');
  }
  if (startConfig.isDemo) {
    const { isNew } = await seedDemo(database);
    logger.info({ isNew }, 'demo scenario ready');
  }

  // Listen first, so e-mailed links can name the real port when PORT=0 and PUBLIC_URL is unset.
  const server: Server = createServer();
  await new Promise<void>((resolve) => server.listen(startConfig.port, startConfig.host, () => resolve()));
  const { port } = server.address() as AddressInfo;
  const url = `http://${startConfig.host === '0.0.0.0' ? '127.0.0.1' : startConfig.host}:${port}`;
  const config: Config = {
    ...startConfig,
    jwtSecret,
    publicUrl: startConfig.publicUrl ?? url,
    smtp: fakeSmtp
      ? { ...startConfig.smtp, host: fakeSmtp.host, port: fakeSmtp.port, isSecure: false, user: null, password: null }
      : startConfig.smtp,
  };
  server.on('request', createApp({ config, database, logger }));

  return {
    url,
    database,
    async stop() {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      });
      await fakeSmtp?.stop();
      await database.close();
    },
  };
}
