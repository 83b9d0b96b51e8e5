import { PHOTO_CONTENT_TYPES } from '../../shared/sync/protocol';
import type { CurrentUser } from '../accounts/current-user';
import { assertCan, can } from '../accounts/policy';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import type { ImageJobs } from '../photos/image-jobs';
import { assertDecodableSize } from '../photos/image-size';
import type { PhotoStore, StoredPhotoFile } from '../photos/photo-store';
import type { UploadedFile } from '../photos/photos.service';
import { siteImageOf, siteSummary } from './review.repository';
import { SiteImage } from './site-image.model';

/** Largest site image taken (bytes): a drone orthophoto of a camp exported at a few cm per pixel. */
export const MAX_SITE_IMAGE_BYTES = 16 * 1024 * 1024;

/** The lon/lat box an image covers, north up. */
export interface ImageBounds {
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
}

/** A site image record as the API shows it; `version` goes into the image URL so caches never serve an old picture. */
export interface SiteImageView extends ImageBounds {
  readonly siteId: string;
  readonly contentType: string;
  readonly byteSize: number;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly version: string;
  readonly url: string;
}

/** The record as the API answers it. */
export function siteImageView(image: SiteImage): SiteImageView {
  const version = String(image.updatedAt.getTime());
  return {
    siteId: image.siteId, contentType: image.contentType, byteSize: image.byteSize, widthPx: image.widthPx, heightPx: image.heightPx,
    west: image.west, south: image.south, east: image.east, north: image.north, version, url: `/api/sites/${image.siteId}/image?v=${version}`,
  };
}

/** The first bytes of each image type, so a renamed text file is refused before decoding. */
const SIGNATURES: Record<string, (bytes: Buffer) => boolean> = {
  'image/jpeg': (bytes) => bytes.length > 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff,
  'image/png': (bytes) => bytes.length > 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])),
  'image/webp': (bytes) => bytes.length > 12 && bytes.toString('ascii', 0, 4) === 'RIFF' && bytes.toString('ascii', 8, 12) === 'WEBP',
};

/** A site's georeferenced background image: admins upload it, every reader of the site may fetch it. */
export class SiteImageService {
  constructor(
    private readonly database: Database,
    private readonly store: PhotoStore,
    private readonly jobs: ImageJobs,
  ) {}

  /**
   * Checks the file is an image it can decode, stores it and records its box (replacing any earlier
   * one). With no file, moves the box of the image already stored (corners typed again, no re-upload).
   */
  async upload(user: CurrentUser, siteId: string, file: UploadedFile | null, bounds: ImageBounds): Promise<SiteImageView> {
    assertCan(user, 'site-image:manage');
    if (!(await siteSummary(siteId, user.organizationId))) {
      throw new AppError('not_found', 'No such site');
    }
    if (!file) {
      const existing = await siteImageOf(siteId);
      if (!existing) {
        throw new AppError('validation_failed', 'Send the picture as the multipart field "image"');
      }
      return this.record(siteId, user, bounds, null);
    }
    if (!(PHOTO_CONTENT_TYPES as readonly string[]).includes(file.mimetype) || !SIGNATURES[file.mimetype]?.(file.buffer)) {
      throw new AppError('unsupported_media_type', 'The file is not a JPEG, PNG or WebP image', { accepted: PHOTO_CONTENT_TYPES });
    }
    assertDecodableSize(file.buffer, file.mimetype);
    let decoded: { width: number; height: number };
    try {
      decoded = await this.jobs.decodeThenThumbnail(file.buffer, file.mimetype, (thumbnail) => this.store.put(siteId, 'thumb', thumbnail, 'image/jpeg'));
    } catch {
      throw new AppError('unsupported_media_type', 'The file could not be read as an image');
    }
    await this.store.put(siteId, 'full', file.buffer, file.mimetype);
    return this.record(siteId, user, bounds, { contentType: file.mimetype, byteSize: file.size, widthPx: decoded.width, heightPx: decoded.height });
  }

  private async record(
    siteId: string, user: CurrentUser, bounds: ImageBounds,
    picture: { contentType: string; byteSize: number; widthPx: number; heightPx: number } | null,
  ): Promise<SiteImageView> {
    const saved = await this.database.transaction(async (transaction) => {
      const fields = { ...(picture ?? {}), west: bounds.west, south: bounds.south, east: bounds.east, north: bounds.north, uploadedById: user.id };
      const existing = await SiteImage.findByPk(siteId, { transaction });
      if (existing) {
        // Bump updatedAt even when only the bytes changed, so the image URL's version moves on.
        existing.set({ ...fields, updatedAt: new Date() });
        existing.changed('updatedAt', true);
        return existing.save({ transaction });
      }
      if (!picture) {
        throw new AppError('validation_failed', 'Send the picture as the multipart field "image"');
      }
      return SiteImage.create({ siteId, ...fields }, { transaction });
    });
    return siteImageView(saved);
  }

  /** The record of a site's image, or 404. */
  async describe(user: CurrentUser, siteId: string): Promise<SiteImageView> {
    return siteImageView(await this.findReadable(user, siteId));
  }

  /** The stored bytes of a site's image, or 404. */
  async read(user: CurrentUser, siteId: string): Promise<{ image: SiteImageView; file: StoredPhotoFile }> {
    const image = await this.findReadable(user, siteId);
    const file = await this.store.get(siteId, 'full');
    if (!file) {
      throw new AppError('not_found', 'The site image is recorded but its file is missing');
    }
    return { image: siteImageView(image), file };
  }

  private async findReadable(user: CurrentUser, siteId: string): Promise<SiteImage> {
    assertCan(user, 'site:read');
    const image = can(user, 'site:read', { siteId }) ? await siteImageOf(siteId) : null;
    if (!image || !(await siteSummary(siteId, user.organizationId))) {
      throw new AppError('not_found', 'This site has no image');
    }
    return image;
  }
}
