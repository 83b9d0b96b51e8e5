import { join, resolve } from 'node:path';
import { loadConfig } from '../lib/config';
import { backupDataDir, restoreDataDir } from './backup';

/**
 * `npm run backup [-- FOLDER]` copies the running server's DATA_DIR into FOLDER (default
 * backups/<timestamp>); `npm run restore -- FOLDER` puts it back (stop the server first).
 */
async function main(): Promise<void> {
  const [command, folder] = process.argv.slice(2);
  const config = loadConfig();
  if (config.databaseUrl) {
    throw new Error('This deployment uses DATABASE_URL: back it up with pg_dump and the object store\u2019s own tools.');
  }
  if (command === 'backup') {
    const target = resolve(folder ?? join('backups', new Date().toISOString().replace(/[:.]/g, '-')));
    const manifest = await backupDataDir(config.dataDir, target);
    const rows = Object.values(manifest.tableRowCounts).reduce((sum, count) => sum + count, 0);
    process.stdout.write(`Backup written to ${target} (${Object.keys(manifest.tableRowCounts).length} tables, ${rows} rows${manifest.folders?.length ? `, ${manifest.folders.join(', ')}` : ''})\n`);
  } else if (command === 'restore' && folder) {
    const manifest = await restoreDataDir(resolve(folder), config.dataDir);
    process.stdout.write(`Restored the backup of ${manifest.createdAt} into ${config.dataDir}\n`);
  } else {
    throw new Error('Usage: backup [FOLDER] | restore FOLDER');
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
