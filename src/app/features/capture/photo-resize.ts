/** Longest side of a stored photo (px), DESIGN §5. */
export const PHOTO_LONG_SIDE_PX = 1600;
/** Longest side of the list thumbnail kept on the device (px). */
export const THUMBNAIL_LONG_SIDE_PX = 240;

/** A picture resized on the device: the JPEG to keep and upload, a thumbnail, and the original size. */
export interface ResizedPhoto {
  readonly blob: Blob;
  readonly thumbnail: Blob;
  readonly originalWidth: number;
  readonly originalHeight: number;
}

/** Resizes a camera picture to a JPEG of at most 1600 px on its long side, with canvas. */
export async function resizePhoto(file: Blob): Promise<ResizedPhoto> {
  const bitmap = await createImageBitmap(file);
  try {
    const blob = await drawJpeg(bitmap, PHOTO_LONG_SIDE_PX, 0.85);
    const thumbnail = await drawJpeg(bitmap, THUMBNAIL_LONG_SIDE_PX, 0.7);
    return { blob, thumbnail, originalWidth: bitmap.width, originalHeight: bitmap.height };
  } finally {
    bitmap.close();
  }
}

async function drawJpeg(bitmap: ImageBitmap, longSide: number, quality: number): Promise<Blob> {
  const scale = Math.min(1, longSide / Math.max(bitmap.width, bitmap.height));
  const width = Math.max(1, Math.round(bitmap.width * scale));
  const height = Math.max(1, Math.round(bitmap.height * scale));
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  canvas.getContext('2d')?.drawImage(bitmap, 0, 0, width, height);
  return new Promise((resolve, reject) => canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('could not encode JPEG'))), 'image/jpeg', quality));
}
