import jsQR from 'jsqr';
import { parseHumanCode } from '../../../../../shared/sync/human-code';

/** The pixels of one camera frame (an `ImageData`, or anything shaped like one). */
export type LabelFrame = Pick<ImageData, 'data' | 'width' | 'height'>;

/** What a frame held: a sample code, a QR code that is not one of our labels, or nothing readable. */
export type DecodedLabel =
  | { readonly status: 'code'; readonly code: string }
  | { readonly status: 'not-a-label'; readonly text: string }
  | { readonly status: 'nothing' };

/**
 * Finds a QR code in a frame and reads it as a sample label (`SITE-DEVICE-SEQ`). Pure: pixels in,
 * a value out, so it runs the same in a component loop, a worker or a test.
 */
export function decodeLabel(frame: LabelFrame): DecodedLabel {
  // Printed labels are dark on light; skipping the inverted pass halves the work per frame.
  const found = jsQR(frame.data as Uint8ClampedArray, frame.width, frame.height, { inversionAttempts: 'dontInvert' });
  if (!found) {
    return { status: 'nothing' };
  }
  const text = found.data.trim();
  const parts = parseHumanCode(text);
  return parts && parts.kind === 'sample' ? { status: 'code', code: text } : { status: 'not-a-label', text };
}
