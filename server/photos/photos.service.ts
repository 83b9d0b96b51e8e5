import type { Logger } from 'pino';
import { PHOTO_CONTENT_TYPES } from '../../shared/sync/protocol';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can, readableSiteIds } from '../accounts/policy';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import type { ImageJobs } from './image-jobs';
import { assertDecodableSize } from './image-size';
import { Photo, type StoredSize } from './photo.model';
import type { PhotoStore, StoredPhotoFile } from './photo-store';
import { Op } from 'sequelize';

/** Largest photo the server takes (bytes). Devices send ≤ 1600 px JPEGs, ~0.3–1 MB; 8 MB leaves room for PNG. */
export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;

/** A photo record as the API shows it, with the sizes the server holds. */
export interface PhotoView {
  readonly id: string;
  readonly siteId: string;
  readonly ownerEntity: 'pile' | 'sample';
  readonly ownerId: string;
  readonly contentType: string;
  readonly originalWidth: number;
  readonly originalHeight: number;
  readonly byteSize: number;
  readonly takenAt: string;
  readonly storedSizes: readonly StoredSize[];
  readonly revision: number;
}

/** An uploaded file as multer hands it over. */
export interface UploadedFile {
  readonly buffer: Buffer;
  readonly mimetype: string;
  readonly size: number;
}

/** The first bytes of each image type we store, so a renamed text file is refused before decoding. */
const SIGNATURES: Record<(typeof PHOTO_CONTENT_TYPES)[number], (bytes: Buffer) => boolean> = {
  'image/jpeg': (bytes) => bytes.length > 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff,
  'image/png': (bytes) => bytes.length > 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])),
  'image/webp': (bytes) => bytes.length > 12 && bytes.toString('ascii', 0, 4) === 'RIFF' && bytes.toString('ascii', 8, 12) === 'WEBP',
};

/** Photo bytes: upload after the record has synced, thumbnails off the request path, reads with permission checks. */
export class PhotosService {
  constructor(
    private readonly database: Database,
    private readonly store: PhotoStore,
    private readonly jobs: ImageJobs,
    private readonly logger: Logger,
  ) {}

  /**
   * Stores a photo's bytes. The photo's record must have synced first (it says whose photo it is,
   * and so who may upload it). Uploading the same photo again changes nothing.
   */
  async upload(user: CurrentUser, photoId: string, file: UploadedFile | null): Promise<PhotoView> {
    assertCan(user, 'capture:write');
    const photo = await this.findReadable(user, photoId);
    assertCan(user, 'capture:write', { siteId: photo.siteId, ownerId: photo.createdById });
    if (photo.storedSizes.includes('full')) {
      return toView(photo);
    }
    if (!file) {
      throw new AppError('validation_failed', 'Send the picture as the multipart field "photo"');
    }
    const contentType = file.mimetype as (typeof PHOTO_CONTENT_TYPES)[number];
    if (!PHOTO_CONTENT_TYPES.includes(contentType) || !SIGNATURES[contentType](file.buffer)) {
      throw new AppError('unsupported_media_type', 'The file is not a JPEG, PNG or WebP image', { accepted: PHOTO_CONTENT_TYPES });
    }
    assertDecodableSize(file.buffer, contentType);
    try {
      await this.jobs.decodeThenThumbnail(file.buffer, contentType, async (thumbnail) => {
        await this.store.put(photoId, 'thumb', thumbnail, 'image/jpeg');
        await this.markStored(photoId, 'thumb');
      });
    } catch {
      throw new AppError('unsupported_media_type', 'The file could not be read as an image');
    }
    await this.store.put(photoId, 'full', file.buffer, contentType);
    const stored = await this.markStored(photoId, 'full');
    this.logger.debug({ photoId, byteSize: file.size }, 'photo stored');
    return toView(stored);
  }

  /** The bytes of one size; a thumbnail not yet made falls back to the full image (and says so). */
  async read(user: CurrentUser, photoId: string, size: StoredSize): Promise<{ file: StoredPhotoFile; size: StoredSize }> {
    assertCan(user, 'site:read');
    await this.findReadable(user, photoId);
    const wanted = await this.store.get(photoId, size);
    if (wanted) {
      return { file: wanted, size };
    }
    const full = size === 'thumb' ? await this.store.get(photoId, 'full') : null;
    if (!full) {
      throw new AppError('not_found', 'This photo has not been uploaded yet');
    }
    return { file: full, size: 'full' };
  }

  /** Photo records of one pile or sample, or every photo the user may read (newest first, at most 500). */
  async list(user: CurrentUser, filter: { ownerEntity?: 'pile' | 'sample'; ownerId?: string }): Promise<PhotoView[]> {
    assertCan(user, 'site:read');
    const readable = readableSiteIds(user);
    const where: Record<string, unknown> = { deletedAt: null };
    if (readable !== 'all') {
      where['siteId'] = { [Op.in]: [...readable] };
    }
    if (filter.ownerEntity) {
      where['ownerEntity'] = filter.ownerEntity;
    }
    if (filter.ownerId) {
      where['ownerId'] = filter.ownerId;
    }
    const rows = await Photo.findAll({ where, order: [['takenAt', 'DESC']], limit: 500 });
    return rows.map(toView);
  }

  private async findReadable(user: CurrentUser, photoId: string): Promise<Photo> {
    const photo = await Photo.findByPk(photoId);
    if (!photo || photo.deletedAt !== null || !can(user, 'site:read', { siteId: photo.siteId })) {
      throw new AppError('not_found', 'No such photo; sync its record before uploading the picture');
    }
    return photo;
  }

  private markStored(photoId: string, size: StoredSize): Promise<Photo> {
    return this.database.transaction(async (transaction) => {
      const photo = await Photo.findByPk(photoId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!photo) {
        throw new AppError('not_found', 'No such photo');
      }
      if (!photo.storedSizes.includes(size)) {
        await photo.update({ storedSizes: [...photo.storedSizes, size].sort() }, { transaction });
      }
      return photo;
    });
  }
}

function toView(photo: Photo): PhotoView {
  return {
    id: photo.id, siteId: photo.siteId, ownerEntity: photo.ownerEntity, ownerId: photo.ownerId, contentType: photo.contentType,
    originalWidth: photo.originalWidth, originalHeight: photo.originalHeight, byteSize: photo.byteSize,
    takenAt: photo.takenAt.toISOString(), storedSizes: photo.storedSizes, revision: photo.revision,
  };
}
