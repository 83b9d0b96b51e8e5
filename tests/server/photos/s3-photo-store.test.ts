import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import S3rver from 's3rver';
import { S3PhotoStore, parseS3Location } from '../../../server/photos/s3-photo-store';

// s3rver is a real S3-compatible HTTP server (from npm) on loopback; the store talks to it with the AWS SDK.
// Its default credentials are the well-known fake pair S3RVER / S3RVER.
const BUCKET = 'heapsight-photos';
const PHOTO_ID = '0b6f1c2e-3d4a-4b5c-8d6e-7f8091a2b3c4';

async function readAll(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) {
    chunks.push(Buffer.from(chunk as Buffer));
  }
  return Buffer.concat(chunks);
}

describe('S3PhotoStore against an S3-compatible server', () => {
  let directory: string;
  let server: S3rver;
  let store: S3PhotoStore;

  beforeAll(async () => {
    directory = mkdtempSync(join(tmpdir(), 'heapsight-s3-'));
    server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory, configureBuckets: [{ name: BUCKET, configs: [] }] });
    const { port } = await server.run();
    store = new S3PhotoStore({
      bucket: BUCKET, prefix: 'camp-a', endpoint: `http://127.0.0.1:${port}`, region: 'us-east-1', forcePathStyle: true,
      credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    });
  });

  afterAll(async () => {
    store.destroy();
    await server.close();
    rmSync(directory, { recursive: true, force: true });
  });

  it('gives back exactly the bytes and type it was given', async () => {
    const bytes = Buffer.from(Array.from({ length: 5000 }, (_, index) => index % 251));
    await store.put(PHOTO_ID, 'full', bytes, 'image/jpeg');

    const stored = await store.get(PHOTO_ID, 'full');

    expect(stored?.contentType).toBe('image/jpeg');
    expect(stored?.byteSize).toBe(5000);
    expect(await readAll(stored!.stream)).toEqual(bytes);
    expect(await store.has(PHOTO_ID, 'full')).toBe(true);
  });

  it('answers null and false for a size that was never stored', async () => {
    await expect(store.get(PHOTO_ID, 'thumb')).resolves.toBeNull();
    await expect(store.has(PHOTO_ID, 'thumb')).resolves.toBe(false);
  });

  it('overwrites on a repeated put, so uploads stay idempotent', async () => {
    await store.put(PHOTO_ID, 'thumb', Buffer.from('first'), 'image/jpeg');
    await store.put(PHOTO_ID, 'thumb', Buffer.from('second'), 'image/jpeg');
    expect((await readAll((await store.get(PHOTO_ID, 'thumb'))!.stream)).toString()).toBe('second');
  });

  it('removes every size of a photo', async () => {
    await store.remove(PHOTO_ID);
    expect(await store.has(PHOTO_ID, 'full')).toBe(false);
    expect(await store.has(PHOTO_ID, 'thumb')).toBe(false);
  });

  it('refuses an id that is not a UUID, so no key outside photos/ can be reached', async () => {
    await expect(store.get('../../secrets', 'full')).rejects.toThrow(/not a photo id/);
  });
});

describe('parseS3Location', () => {
  it('reads the bucket and an optional prefix', () => {
    expect(parseS3Location('s3://heapsight-photos')).toEqual({ bucket: 'heapsight-photos', prefix: '' });
    expect(parseS3Location('s3://heapsight-photos/org/a/')).toEqual({ bucket: 'heapsight-photos', prefix: 'org/a' });
  });

  it('refuses anything that is not an s3:// location', () => {
    expect(() => parseS3Location('https://bucket.example/x')).toThrow(/PHOTO_STORE must look like/);
    expect(() => parseS3Location('s3://')).toThrow(/PHOTO_STORE/);
  });
});
