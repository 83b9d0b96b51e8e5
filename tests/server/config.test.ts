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

describe('loadConfig photo store', () => {
  it('keeps photos on the local disk unless told otherwise', () => {
    expect(loadConfig({}).photoStore).toEqual({ kind: 'disk' });
  });

  it('reads an S3-compatible store with its endpoint', () => {
    expect(loadConfig({ PHOTO_STORE: 's3://heapsight-photos/camp', S3_ENDPOINT: 'http://127.0.0.1:9000' }).photoStore).toEqual({
      kind: 's3', location: 's3://heapsight-photos/camp', endpoint: 'http://127.0.0.1:9000', region: 'us-east-1', forcePathStyle: true,
    });
  });

  it('refuses a photo store that is neither disk nor s3://', () => {
    expect(() => loadConfig({ PHOTO_STORE: 'ftp://old-server' })).toThrow(/PHOTO_STORE/);
  });
});
