import { createReadStream } from 'node:fs';
import { mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import type { StoredSize } from './photo.model';

/** One stored photo file: its bytes as a stream, size and type. */
export interface StoredPhotoFile {
  readonly stream: Readable;
  readonly byteSize: number;
  readonly contentType: string;
}

/**
 * Where photo bytes live. The local disk is the default (and the local fake of object storage); an
 * S3-compatible store implements the same four calls with keys `photos/<uuid>/<size>`.
 */
export interface PhotoStore {
  put(photoId: string, size: StoredSize, bytes: Buffer, contentType: string): Promise<void>;
  get(photoId: string, size: StoredSize): Promise<StoredPhotoFile | null>;
  has(photoId: string, size: StoredSize): Promise<boolean>;
  remove(photoId: string): Promise<void>;
}

const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Photos as files under `<root>/<uuid>/<size>` (root is DATA_DIR/photos), written atomically by rename. */
export class LocalDiskPhotoStore implements PhotoStore {
  constructor(private readonly root: string) {}

  async put(photoId: string, size: StoredSize, bytes: Buffer, contentType: string): Promise<void> {
    const folder = this.folderOf(photoId);
    await mkdir(folder, { recursive: true });
    const temporary = join(folder, `.${size}.${process.pid}.${Date.now()}.tmp`);
    await writeFile(temporary, bytes);
    await rename(temporary, join(folder, size));
    await writeFile(join(folder, `${size}.type`), contentType);
  }

  async get(photoId: string, size: StoredSize): Promise<StoredPhotoFile | null> {
    const path = join(this.folderOf(photoId), size);
    try {
      const info = await stat(path);
      const contentType = (await readFile(`${path}.type`, 'utf8').catch(() => 'image/jpeg')).trim();
      return { stream: createReadStream(path), byteSize: info.size, contentType };
    } catch {
      return null;
    }
  }

  async has(photoId: string, size: StoredSize): Promise<boolean> {
    return stat(join(this.folderOf(photoId), size)).then(() => true, () => false);
  }

  async remove(photoId: string): Promise<void> {
    await rm(this.folderOf(photoId), { recursive: true, force: true });
  }

  private folderOf(photoId: string): string {
    // The id comes from a URL; only a UUID may name a folder, so no path can escape the root.
    if (!UUID_PATTERN.test(photoId)) {
      throw new Error(`not a photo id: ${photoId}`);
    }
    return join(this.root, photoId.toLowerCase());
  }
}
