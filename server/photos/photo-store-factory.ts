import { join } from 'node:path';
import type { Config } from '../lib/config';
import { LocalDiskPhotoStore, type PhotoStore } from './photo-store';
import { S3PhotoStore, parseS3Location } from './s3-photo-store';

/** The photo store the configuration asks for: DATA_DIR/photos by default, or an S3-compatible bucket. */
export function createPhotoStore(config: Pick<Config, 'dataDir' | 'photoStore'>): PhotoStore {
  if (config.photoStore.kind === 'disk') {
    return new LocalDiskPhotoStore(join(config.dataDir, 'photos'));
  }
  const { bucket, prefix } = parseS3Location(config.photoStore.location);
  const accessKeyId = process.env['AWS_ACCESS_KEY_ID'];
  const secretAccessKey = process.env['AWS_SECRET_ACCESS_KEY'];
  return new S3PhotoStore({
    bucket,
    prefix,
    endpoint: config.photoStore.endpoint ?? undefined,
    region: config.photoStore.region,
    forcePathStyle: config.photoStore.forcePathStyle,
    credentials: accessKeyId && secretAccessKey ? { accessKeyId, secretAccessKey } : undefined,
  });
}
