import { cpSync, existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import sqlite3 from 'sqlite3';

/**
 * Online backup and restore of an embedded deployment: the SQLite database and the file folders
 * (photos, site images, mail) in DATA_DIR. The database copy is made with `VACUUM INTO`, which reads one consistent snapshot while
 * the server keeps running and writing (SQLite ≥ 3.27).
 * PostgreSQL deployments back up with pg_dump and their object store's own tools instead.
 */

/** What a backup folder holds, written beside the copy as backup.json. */
export interface BackupManifest {
  readonly createdAt: string;
  readonly databaseFile: string;
  readonly tableRowCounts: Record<string, number>;
  readonly hasPhotos: boolean;
  /** The file folders of DATA_DIR copied beside the database (absent in backups made before they were listed). */
  readonly folders?: readonly string[];
}

const DATABASE_FILE = 'heapsight.sqlite';
const PHOTOS_FOLDER = 'photos';
/**
 * The folders of DATA_DIR that hold files the database refers to or that people need back:
 * photos, the review desk's site images, and the local mail folder (the fake SMTP server's messages).
 */
export const DATA_FOLDERS = [PHOTOS_FOLDER, 'site-images', 'mail'] as const;

/** Copies the live database and photo store of `dataDir` into `targetDir` (which must not exist). */
export async function backupDataDir(dataDir: string, targetDir: string, now: Date = new Date()): Promise<BackupManifest> {
  const source = join(dataDir, DATABASE_FILE);
  if (!existsSync(source)) {
    throw new Error(`No database at ${source}: nothing to back up`);
  }
  if (existsSync(targetDir)) {
    throw new Error(`${targetDir} exists already: choose a new folder for the backup`);
  }
  mkdirSync(targetDir, { recursive: true });
  const copy = join(targetDir, DATABASE_FILE);
  const database = await open(source, sqlite3.OPEN_READWRITE);
  try {
    await run(database, 'PRAGMA busy_timeout = 10000');
    await run(database, 'VACUUM INTO ?', [copy]);
  } finally {
    await close(database);
  }
  // Files are written once under new names (photos, images by id; mail by time), so copying them
  // after the snapshot can only add files, never miss one the snapshot refers to.
  const folders = DATA_FOLDERS.filter((folder) => existsSync(join(dataDir, folder)));
  for (const folder of folders) {
    cpSync(join(dataDir, folder), join(targetDir, folder), { recursive: true });
  }
  const manifest: BackupManifest = {
    createdAt: now.toISOString(),
    databaseFile: DATABASE_FILE,
    tableRowCounts: await countRows(copy),
    hasPhotos: folders.includes(PHOTOS_FOLDER),
    folders,
  };
  writeFileSync(join(targetDir, 'backup.json'), `${JSON.stringify(manifest, null, 2)}\n`);
  return manifest;
}

/**
 * Puts a backup back into `dataDir`. The server must be stopped: restoring under a running server
 * would swap the file beneath its open connections. The copy is checked before anything is replaced.
 */
export async function restoreDataDir(backupDir: string, dataDir: string): Promise<BackupManifest> {
  const manifest = JSON.parse(readFileSync(join(backupDir, 'backup.json'), 'utf8')) as BackupManifest;
  const copy = join(backupDir, manifest.databaseFile);
  const check = await integrityCheck(copy);
  if (check !== 'ok') {
    throw new Error(`The backup's database fails its integrity check: ${check}`);
  }
  mkdirSync(dataDir, { recursive: true });
  const target = join(dataDir, DATABASE_FILE);
  for (const suffix of ['', '-wal', '-shm']) {
    rmSync(`${target}${suffix}`, { force: true });
  }
  cpSync(copy, target);
  const folders = manifest.folders ?? (manifest.hasPhotos ? [PHOTOS_FOLDER] : []);
  for (const folder of folders) {
    if (!(DATA_FOLDERS as readonly string[]).includes(folder)) {
      throw new Error(`The backup lists an unknown folder: ${folder}`);
    }
    rmSync(join(dataDir, folder), { recursive: true, force: true });
    cpSync(join(backupDir, folder), join(dataDir, folder), { recursive: true });
  }
  return manifest;
}

/** `PRAGMA integrity_check` of a database file: "ok" or the first problem SQLite reports. */
export async function integrityCheck(file: string): Promise<string> {
  const database = await open(file, sqlite3.OPEN_READONLY);
  try {
    const rows = await all<{ integrity_check: string }>(database, 'PRAGMA integrity_check');
    return rows[0]?.integrity_check ?? 'no answer';
  } finally {
    await close(database);
  }
}

async function countRows(file: string): Promise<Record<string, number>> {
  const database = await open(file, sqlite3.OPEN_READONLY);
  try {
    const tables = await all<{ name: string }>(database, "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name");
    const counts: Record<string, number> = {};
    for (const { name } of tables) {
      const [row] = await all<{ count: number }>(database, `SELECT COUNT(*) AS count FROM "${name.replace(/"/g, '""')}"`);
      counts[name] = row.count;
    }
    return counts;
  } finally {
    await close(database);
  }
}

function open(file: string, mode: number): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const database = new sqlite3.Database(file, mode, (error) => (error ? reject(error) : resolve(database)));
  });
}

function run(database: sqlite3.Database, sql: string, parameters: unknown[] = []): Promise<void> {
  return new Promise((resolve, reject) => database.run(sql, parameters, (error) => (error ? reject(error) : resolve())));
}

function all<T>(database: sqlite3.Database, sql: string): Promise<T[]> {
  return new Promise((resolve, reject) => database.all(sql, (error, rows) => (error ? reject(error) : resolve(rows as T[]))));
}

function close(database: sqlite3.Database): Promise<void> {
  return new Promise((resolve, reject) => database.close((error) => (error ? reject(error) : resolve())));
}
