import { Jimp } from 'jimp';
import { SerialQueue } from '../db/database';

/** Long side of a thumbnail (px): enough for a list row on a phone at 3x density. */
export const THUMBNAIL_LONG_SIDE_PX = 320;
/** JPEG quality of thumbnails; 75 keeps a 320 px thumbnail near 15 kB. */
const THUMBNAIL_QUALITY = 75;

/** What decoding proved about an upload. */
export interface DecodedImage {
  readonly width: number;
  readonly height: number;
}

/**
 * Image work, one job at a time in process, so a burst of uploads at camp never decodes several
 * 1600 px images at once (jimp holds each decoded image as raw RGBA, ~10 MB). An upload waits only
 * for the decode that proves it is an image; the thumbnail is made after the answer has gone.
 */
export class ImageJobs {
  private readonly queue = new SerialQueue();
  private pending = 0;
  private idleWaiters: (() => void)[] = [];

  /**
   * Decodes the bytes (rejecting what is not an image) and then, in the same job, makes the
   * thumbnail and hands it to `onThumbnail`. Resolves as soon as the decode is done.
   */
  decodeThenThumbnail(bytes: Buffer, contentType: string, onThumbnail: (thumbnail: Buffer) => Promise<void>): Promise<DecodedImage> {
    return new Promise<DecodedImage>((resolve, reject) => {
      this.pending += 1;
      void this.queue
        .run(async () => {
          let image: ReturnType<typeof Jimp.fromBitmap>;
          try {
            image = await decode(bytes, contentType);
          } catch (error) {
            reject(error);
            return;
          }
          resolve({ width: image.width, height: image.height });
          const scale = THUMBNAIL_LONG_SIDE_PX / Math.max(image.width, image.height);
          if (scale < 1) {
            image.resize({ w: Math.round(image.width * scale), h: Math.round(image.height * scale) });
          }
          const thumbnail = await image.getBuffer('image/jpeg', { quality: THUMBNAIL_QUALITY });
          await onThumbnail(thumbnail);
        })
        .catch(() => undefined)
        .finally(() => {
          this.pending -= 1;
          if (this.pending === 0) {
            this.idleWaiters.splice(0).forEach((wake) => wake());
          }
        });
    });
  }

  /** Resolves once every queued job has finished (tests and shutdown). */
  idle(): Promise<void> {
    return this.pending === 0 ? Promise.resolve() : new Promise((resolve) => this.idleWaiters.push(resolve));
  }
}

/**
 * Decodes with the decoder for the type the caller has already checked by signature. (Jimp.read
 * would sniff the type itself through a dynamic import, which adds nothing here.)
 */
async function decode(bytes: Buffer, contentType: string): Promise<ReturnType<typeof Jimp.fromBitmap>> {
  type Format = { mime: string; decode(data: Buffer): Promise<{ data: Buffer; width: number; height: number }> | { data: Buffer; width: number; height: number } };
  const formats = (new Jimp({ width: 1, height: 1 }) as unknown as { formats: Format[] }).formats;
  const format = formats.find((candidate) => candidate.mime === contentType);
  if (!format) {
    throw new Error(`no decoder for ${contentType}`);
  }
  const bitmap = await format.decode(bytes);
  if (!bitmap || bitmap.width < 1 || bitmap.height < 1) {
    throw new Error('empty image');
  }
  return Jimp.fromBitmap(bitmap);
}
