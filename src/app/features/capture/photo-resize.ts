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

/** The size a picture is drawn at so its long side is at most `longSide`, keeping its shape; never enlarged. */
export function fitLongSide(width: number, height: number, longSide: number): { width: number; height: number } {
  const scale = Math.min(1, longSide / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

async function drawJpeg(bitmap: ImageBitmap, longSide: number, quality: number): Promise<Blob> {
  const { width, height } = fitLongSide(bitmap.width, bitmap.height, longSide);
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  canvas.getContext('2d')?.drawImage(bitmap, 0, 0, width, height);
  return new Promise((resolve, reject) => canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('could not encode JPEG'))), 'image/jpeg', quality));
}
