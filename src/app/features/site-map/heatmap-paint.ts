import { RAMP_STEPS, rampTable } from '../../shared/ui/colour-ramp/colour-ramp';

const ramp = rampTable();
// Cells with a value are drawn at 80 % opacity so the piles and the site image show through.
const CELL_ALPHA = 204;

/** RGBA pixels of a grid with our ramp: row 0 is north, as an image is drawn; cells with no sample near stay clear. */
export function paintGrid(values: Float64Array, hasValue: Uint8Array, minValue: number, maxValue: number): Uint8ClampedArray<ArrayBuffer> {
  const pixels = new Uint8ClampedArray(values.length * 4);
  const span = maxValue - minValue;
  for (let cell = 0; cell < values.length; cell += 1) {
    if (!hasValue[cell]) continue;
    const position = span > 0 ? (values[cell] - minValue) / span : 0.5;
    const step = Math.min(RAMP_STEPS - 1, Math.max(0, Math.round(position * (RAMP_STEPS - 1)))) * 3;
    const offset = cell * 4;
    pixels[offset] = ramp[step];
    pixels[offset + 1] = ramp[step + 1];
    pixels[offset + 2] = ramp[step + 2];
    pixels[offset + 3] = CELL_ALPHA;
  }
  return pixels;
}

/** The pixels as a PNG blob (OffscreenCanvas works in a worker and on the page alike). */
export function pixelsToPng(pixels: Uint8ClampedArray<ArrayBuffer>, columns: number, rows: number): Promise<Blob> {
  const canvas = new OffscreenCanvas(columns, rows);
  const context = canvas.getContext('2d') as OffscreenCanvasRenderingContext2D;
  context.putImageData(new ImageData(pixels, columns, rows), 0, 0);
  return canvas.convertToBlob({ type: 'image/png' });
}
