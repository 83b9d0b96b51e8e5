import {
  DeleteObjectsCommand, GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, NoSuchKey, NotFound,
  PutObjectCommand, S3Client,
} from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import type { StoredSize } from './photo.model';
import type { PhotoStore, StoredPhotoFile } from './photo-store';

/** Where an S3-compatible store keeps photos: bucket, key prefix and how to reach it. */
export interface S3PhotoStoreOptions {
  readonly bucket: string;
  /** Key prefix inside the bucket, without a trailing slash ("" for the bucket's root). */
  readonly prefix: string;
  /** Endpoint of an S3-compatible server (MinIO, a local fake); absent for AWS itself. */
  readonly endpoint?: string;
  readonly region: string;
  /** Path-style URLs (`endpoint/bucket/key`), which most S3-compatible servers need. */
  readonly forcePathStyle: boolean;
  readonly credentials?: { accessKeyId: string; secretAccessKey: string };
}

const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Photos in S3-compatible object storage under `<prefix>/photos/<uuid>/<size>`, so several stateless
 * app servers can share one bucket. Credentials come from the options or the usual AWS
 * environment variables and profiles.
 */
export class S3PhotoStore implements PhotoStore {
  private readonly client: S3Client;

  constructor(private readonly options: S3PhotoStoreOptions) {
    this.client = new S3Client({
      region: options.region,
      endpoint: options.endpoint,
      forcePathStyle: options.forcePathStyle,
      credentials: options.credentials,
    });
  }

  async put(photoId: string, size: StoredSize, bytes: Buffer, contentType: string): Promise<void> {
    await this.client.send(new PutObjectCommand({
      Bucket: this.options.bucket, Key: this.keyOf(photoId, size), Body: bytes, ContentType: contentType,
      ContentLength: bytes.length,
    }));
  }

  async get(photoId: string, size: StoredSize): Promise<StoredPhotoFile | null> {
    try {
      const object = await this.client.send(new GetObjectCommand({ Bucket: this.options.bucket, Key: this.keyOf(photoId, size) }));
      return {
        stream: object.Body as Readable,
        byteSize: Number(object.ContentLength ?? 0),
        contentType: object.ContentType ?? 'image/jpeg',
      };
    } catch (error) {
      if (isMissing(error)) {
        return null;
      }
      throw error;
    }
  }

  async has(photoId: string, size: StoredSize): Promise<boolean> {
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.options.bucket, Key: this.keyOf(photoId, size) }));
      return true;
    } catch (error) {
      if (isMissing(error)) {
        return false;
      }
      throw error;
    }
  }

  async remove(photoId: string): Promise<void> {
    const listed = await this.client.send(new ListObjectsV2Command({ Bucket: this.options.bucket, Prefix: this.folderOf(photoId) }));
    const keys = (listed.Contents ?? []).map((object) => ({ Key: object.Key as string }));
    if (keys.length > 0) {
      await this.client.send(new DeleteObjectsCommand({ Bucket: this.options.bucket, Delete: { Objects: keys } }));
    }
  }

  /** Closes the client's sockets (tests and shutdown). */
  destroy(): void {
    this.client.destroy();
  }

  private keyOf(photoId: string, size: StoredSize): string {
    return `${this.folderOf(photoId)}${size}`;
  }

  private folderOf(photoId: string): string {
    // The id comes from a URL; only a UUID may name a key, so no request can reach another object.
    if (!UUID_PATTERN.test(photoId)) {
      throw new Error(`not a photo id: ${photoId}`);
    }
    return `${this.options.prefix ? `${this.options.prefix}/` : ''}photos/${photoId.toLowerCase()}/`;
  }
}

function isMissing(error: unknown): boolean {
  if (error instanceof NoSuchKey || error instanceof NotFound) {
    return true;
  }
  const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
  return status === 404;
}

/** Reads `s3://bucket/optional/prefix` into bucket and prefix; throws on anything else. */
export function parseS3Location(location: string): { bucket: string; prefix: string } {
  const match = /^s3:\/\/([a-z0-9][a-z0-9.-]{1,61}[a-z0-9])(\/.*)?$/.exec(location);
  if (!match) {
    throw new Error(`PHOTO_STORE must look like s3://bucket or s3://bucket/prefix, not "${location}"`);
  }
  return { bucket: match[1], prefix: (match[2] ?? '').replace(/^\/+|\/+$/g, '') };
}
