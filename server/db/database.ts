import { Sequelize, Transaction } from 'sequelize';
import type { Config } from '../lib/config';

/** How long a SQLite connection waits for another writer before giving up (ms). */
const SQLITE_BUSY_TIMEOUT_MS = 10_000;

/** The database handle plus the one way to run a write transaction on it. */
export interface Database {
  readonly sequelize: Sequelize;
  readonly dialect: 'sqlite' | 'postgres';
  /** Runs `work` in one transaction; on SQLite, write transactions also queue behind each other. */
  transaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T>;
  close(): Promise<void>;
}

/**
 * Opens the configured database: PostgreSQL (or another Sequelize dialect) from DATABASE_URL, else
 * the embedded SQLite file in the data folder, in WAL mode so readers never wait for the writer.
 */
export async function openDatabase(config: Pick<Config, 'databaseUrl' | 'sqliteFile'>): Promise<Database> {
  const isPostgres = config.databaseUrl !== null && /^postgres(ql)?:/.test(config.databaseUrl);
  const sequelize = isPostgres
    ? new Sequelize(config.databaseUrl as string, { dialect: 'postgres', logging: false, pool: { max: 10 } })
    : new Sequelize({ dialect: 'sqlite', storage: config.sqliteFile, logging: false });

  if (!isPostgres) {
    configureSqliteConnections(sequelize);
    if (config.sqliteFile !== ':memory:') {
      await sequelize.query('PRAGMA journal_mode = WAL');
    }
    await sequelize.query('PRAGMA synchronous = NORMAL');
  }
  await sequelize.authenticate();

  const writeQueue = new SerialQueue();
  return {
    sequelize,
    dialect: isPostgres ? 'postgres' : 'sqlite',
    transaction: (work) =>
      isPostgres
        ? sequelize.transaction((transaction) => work(transaction))
        : writeQueue.run(() => sequelize.transaction((transaction) => work(transaction))),
    close: () => sequelize.close(),
  };
}

/**
 * Sequelize's SQLite dialect opens a fresh sqlite3 connection for each transaction and offers no
 * hook to configure it. SQLite allows one writer at a time, so every new connection gets a busy
 * timeout (wait, don't fail with SQLITE_BUSY) — set here by wrapping the connection manager once.
 */
function configureSqliteConnections(sequelize: Sequelize): void {
  type SqliteConnection = { configure(option: 'busyTimeout', value: number): void };
  const manager = (sequelize as unknown as { connectionManager: { getConnection(options?: unknown): Promise<SqliteConnection> } })
    .connectionManager;
  const configured = new WeakSet<SqliteConnection>();
  const getConnection = manager.getConnection.bind(manager);
  manager.getConnection = async (options?: unknown) => {
    const connection = await getConnection(options);
    if (!configured.has(connection)) {
      connection.configure('busyTimeout', SQLITE_BUSY_TIMEOUT_MS);
      configured.add(connection);
    }
    return connection;
  };
}

/** Runs async jobs one after another, in arrival order (SQLite's single-writer rule, in process). */
export class SerialQueue {
  private tail: Promise<unknown> = Promise.resolve();

  run<T>(job: () => Promise<T>): Promise<T> {
    const result = this.tail.then(job, job);
    this.tail = result.catch(() => undefined);
    return result;
  }
}
