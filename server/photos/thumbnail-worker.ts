/**
 * Runs in a worker thread (see ImageJobs): decodes an upload, tells the caller its size on `port` as
 * soon as the decode has proved it an image, then makes the thumbnail and returns it. Decoding a
 * 1600 px JPEG with jimp takes a few hundred milliseconds of pure JavaScript; on the main thread that
 * stalls every request in flight, here it stalls nothing.
 */
import type { MessagePort } from 'node:worker_threads';
import { Jimp } from 'jimp';

/** Long side of a thumbnail (px): enough for a list row on a phone at 3x density. */
export const THUMBNAIL_LONG_SIDE_PX = 320;
/** JPEG quality of thumbnails; 75 keeps a 320 px thumbnail near 15 kB. */
const THUMBNAIL_QUALITY = 75;

export interface ThumbnailTask {
  readonly bytes: Uint8Array;
  readonly contentType: string;
  /** Receives `{ width, height }` once decoded. */
  readonly port: MessagePort;
}

export default async function makeThumbnail({ bytes, contentType, port }: ThumbnailTask): Promise<Uint8Array> {
  try {
    const image = await decode(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), contentType);
    port.postMessage({ width: image.width, height: image.height });
    const scale = THUMBNAIL_LONG_SIDE_PX / Math.max(image.width, image.height);
    if (scale < 1) {
      image.resize({ w: Math.round(image.width * scale), h: Math.round(image.height * scale) });
    }
    return await image.getBuffer('image/jpeg', { quality: THUMBNAIL_QUALITY });
  } finally {
    port.close();
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
