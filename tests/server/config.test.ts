import { loadConfig } from '../../server/lib/config';

describe('loadConfig', () => {
  it('defaults to port 4300, SQLite in data/ and no demo', () => {
    const config = loadConfig({});
    expect(config.port).toBe(4300);
    expect(config.databaseUrl).toBeNull();
    expect(config.sqliteFile).toMatch(/data[\\/]heapsight\.sqlite$/);
    expect(config.isDemo).toBe(false);
  });

  it('puts the database inside DATA_DIR so a second instance can run beside the first', () => {
    expect(loadConfig({ DATA_DIR: '/tmp/second' }).sqliteFile).toBe('/tmp/second/heapsight.sqlite');
  });

  it('refuses a bad port and a short secret, naming both', () => {
    expect(() => loadConfig({ PORT: 'eighty', JWT_SECRET: 'short' })).toThrow(/PORT[\s\S]*JWT_SECRET/);
  });
});
