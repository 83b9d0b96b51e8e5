import { randomUUID } from 'node:crypto';
import { mkdirSync, mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { QueryTypes, Sequelize } from 'sequelize';
import { Organization } from '../../../server/sites/organization.model';
import { backupDataDir, integrityCheck, restoreDataDir } from '../../../server/ops/backup';
import { createTestApp, type TestApp } from '../support/test-app';

// The online backup is SQLite's; a PostgreSQL deployment uses pg_dump, so this story runs on SQLite only.
const describeOnSqlite = process.env['TEST_DATABASE_URL'] ? describe.skip : describe;

async function dumpEveryTable(file: string): Promise<Record<string, unknown[]>> {
  const sequelize = new Sequelize({ dialect: 'sqlite', storage: file, logging: false });
  try {
    const tables = await sequelize.query<{ name: string }>(
      "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name",
      { type: QueryTypes.SELECT },
    );
    const dump: Record<string, unknown[]> = {};
    for (const { name } of tables) {
      dump[name] = await sequelize.query(`SELECT * FROM "${name}" ORDER BY 1`, { type: QueryTypes.SELECT });
    }
    return dump;
  } finally {
    await sequelize.close();
  }
}

describeOnSqlite('npm run backup / npm run restore', () => {
  let testApp: TestApp;

  beforeAll(async () => {
    testApp = await createTestApp();
  });

  afterAll(() => testApp.close());

  it('restores a backup taken while the server runs to the same rows in every table, with the photos, site images and mail', async () => {
    mkdirSync(join(testApp.dataDir, 'photos'), { recursive: true });
    writeFileSync(join(testApp.dataDir, 'photos', 'a-photo.jpg'), Buffer.from([0xff, 0xd8, 0xff, 0xd9]));
    mkdirSync(join(testApp.dataDir, 'site-images', 'a-site'), { recursive: true });
    writeFileSync(join(testApp.dataDir, 'site-images', 'a-site', 'full'), Buffer.from([0x89, 0x50, 0x4e, 0x47]));
    mkdirSync(join(testApp.dataDir, 'mail'), { recursive: true });
    writeFileSync(join(testApp.dataDir, 'mail', 'a-message.eml'), 'Subject: Lab batch\r\n\r\nattached');
    const backupDir = join(mkdtempSync(join(tmpdir(), 'heapsight-backup-')), 'copy');

    const manifest = await backupDataDir(testApp.dataDir, backupDir);

    const restoredDir = mkdtempSync(join(tmpdir(), 'heapsight-restored-'));
    await restoreDataDir(backupDir, restoredDir);
    const live = await dumpEveryTable(testApp.config.sqliteFile);
    const restored = await dumpEveryTable(join(restoredDir, 'heapsight.sqlite'));
    expect(Object.keys(restored)).toEqual(Object.keys(live));
    expect(restored).toEqual(live);
    expect(manifest.tableRowCounts['users']).toBe(5);
    expect(readdirSync(join(restoredDir, 'photos'))).toEqual(['a-photo.jpg']);
    expect(readdirSync(join(restoredDir, 'site-images', 'a-site'))).toEqual(['full']);
    expect(readdirSync(join(restoredDir, 'mail'))).toEqual(['a-message.eml']);
    expect(manifest.folders).toEqual(['photos', 'site-images', 'mail']);
  });

  it('takes a consistent snapshot while writes keep arriving', async () => {
    const before = await Organization.count();
    const writes = Array.from({ length: 40 }, (_, index) =>
      testApp.database.transaction((transaction) => Organization.create({ id: randomUUID(), name: `Writer ${index}` }, { transaction })));
    const backupDir = join(mkdtempSync(join(tmpdir(), 'heapsight-backup-')), 'copy');

    const manifest = await backupDataDir(testApp.dataDir, backupDir);
    await Promise.all(writes);

    expect(await integrityCheck(join(backupDir, 'heapsight.sqlite'))).toBe('ok');
    expect(manifest.tableRowCounts['organizations']).toBeGreaterThanOrEqual(before);
    expect(manifest.tableRowCounts['organizations']).toBeLessThanOrEqual(before + 40);
  });

  it('refuses to write over an existing folder and to restore a damaged copy', async () => {
    const existing = mkdtempSync(join(tmpdir(), 'heapsight-backup-'));
    await expect(backupDataDir(testApp.dataDir, existing)).rejects.toThrow(/exists already/);

    const damaged = mkdtempSync(join(tmpdir(), 'heapsight-damaged-'));
    writeFileSync(join(damaged, 'backup.json'), JSON.stringify({ databaseFile: 'heapsight.sqlite', hasPhotos: false }));
    writeFileSync(join(damaged, 'heapsight.sqlite'), 'this is not a database');
    const target = mkdtempSync(join(tmpdir(), 'heapsight-target-'));
    await expect(restoreDataDir(damaged, target)).rejects.toThrow();
    expect(readdirSync(target)).toEqual([]);
  });
});
