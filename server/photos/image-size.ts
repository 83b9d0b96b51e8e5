import { AppError } from '../lib/errors';

/**
 * Width and height read from an image's header, without decoding a single pixel. A decoder holds
 * every pixel as RGBA, so a small file that declares a huge picture (a decompression bomb) must be
 * measured and refused before any decoder sees it.
 */
export interface ImageSize {
  readonly width: number;
  readonly height: number;
}

/**
 * Most pixels the server will decode: 40 megapixels is 160 MB as RGBA, one drone orthophoto of a
 * camp at a few centimetres a pixel; a phone's photo (long side ≤ 1600 px) is under 2 megapixels.
 */
export const MAX_DECODE_PIXELS = 40_000_000;

/** JPEG start-of-frame markers (baseline, progressive, lossless, arithmetic) carry the size. */
const JPEG_FRAME_MARKERS = new Set([0xc0, 0xc1, 0xc2, 0xc3, 0xc5, 0xc6, 0xc7, 0xc9, 0xca, 0xcb, 0xcd, 0xce, 0xcf]);

/** The size a JPEG, PNG or WebP file declares, or null when its header cannot be read. */
export function readImageSize(bytes: Buffer, contentType: string): ImageSize | null {
  if (contentType === 'image/png') {
    // Signature (8), then the IHDR chunk: length (4), "IHDR" (4), width (4), height (4).
    return bytes.length >= 24 && bytes.toString('ascii', 12, 16) === 'IHDR' ? { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) } : null;
  }
  if (contentType === 'image/webp') {
    return readWebpSize(bytes);
  }
  if (contentType === 'image/jpeg') {
    return readJpegSize(bytes);
  }
  return null;
}

/** Throws 413 for an image that declares more than MAX_DECODE_PIXELS, 415 for one whose size cannot be read. */
export function assertDecodableSize(bytes: Buffer, contentType: string): ImageSize {
  const size = readImageSize(bytes, contentType);
  if (!size || size.width < 1 || size.height < 1) {
    throw new AppError('unsupported_media_type', 'The file could not be read as an image');
  }
  if (size.width * size.height > MAX_DECODE_PIXELS) {
    throw new AppError('payload_too_large', `The image is ${size.width} × ${size.height} pixels; send at most ${MAX_DECODE_PIXELS / 1_000_000} megapixels`, size);
  }
  return size;
}

function readJpegSize(bytes: Buffer): ImageSize | null {
  let offset = 2;
  // Each segment is 0xFF, a marker, and (for all but the standalone markers) a 2-byte length.
  while (offset + 9 < bytes.length) {
    if (bytes[offset] !== 0xff) {
      return null;
    }
    const marker = bytes[offset + 1];
    if (marker === 0xff) {
      offset += 1;
      continue;
    }
    if (marker === 0xd8 || marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) {
      offset += 2;
      continue;
    }
    if (marker === 0xda || marker === 0xd9) {
      return null;
    }
    if (JPEG_FRAME_MARKERS.has(marker)) {
      return { height: bytes.readUInt16BE(offset + 5), width: bytes.readUInt16BE(offset + 7) };
    }
    offset += 2 + bytes.readUInt16BE(offset + 2);
  }
  return null;
}

function readWebpSize(bytes: Buffer): ImageSize | null {
  if (bytes.length < 30) {
    return null;
  }
  const chunk = bytes.toString('ascii', 12, 16);
  if (chunk === 'VP8X') {
    return { width: 1 + bytes.readUIntLE(24, 3), height: 1 + bytes.readUIntLE(27, 3) };
  }
  if (chunk === 'VP8 ') {
    return { width: bytes.readUInt16LE(26) & 0x3fff, height: bytes.readUInt16LE(28) & 0x3fff };
  }
  if (chunk === 'VP8L') {
    const bits = bytes.readUInt32LE(21);
    return { width: 1 + (bits & 0x3fff), height: 1 + ((bits >>> 14) & 0x3fff) };
  }
  return null;
}
