import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { decodeLabel, type LabelFrame } from './decode-label';

const FIXTURES = join(__dirname, '../../../../../tests/fixtures');

/**
 * A PNG file as a frame. The fixture was made with the `qrcode` package, as the label sheet makes
 * its codes (the pile-code fixture likewise, with `JR-03-P0042`): `QRCode.toFile('tests/fixtures/label-qr-JR-03-0042.png', 'JR-03-0042', { errorCorrectionLevel: 'M', width: 240, margin: 2 })`.
 */
function frameOf(file: string): LabelFrame {
  const png = PNG.sync.read(readFileSync(join(FIXTURES, file)));
  return { data: new Uint8ClampedArray(png.data), width: png.width, height: png.height };
}

/** A blank grey frame, as the camera sees before a label is in view. */
function blankFrame(width: number, height: number): LabelFrame {
  return { data: new Uint8ClampedArray(width * height * 4).fill(180), width, height };
}

describe('decodeLabel', () => {
  it('reads the sample code from a QR label image', () => {
    expect(decodeLabel(frameOf('label-qr-JR-03-0042.png'))).toEqual({ status: 'code', code: 'JR-03-0042' });
  });

  it('reads the code when the label sits small inside a larger frame', () => {
    const label = frameOf('label-qr-JR-03-0042.png');
    const frame = blankFrame(640, 480);
    frame.data.fill(255);
    for (let row = 0; row < label.height; row += 1) {
      const from = row * label.width * 4;
      frame.data.set(label.data.subarray(from, from + label.width * 4), ((row + 100) * 640 + 200) * 4);
    }

    expect(decodeLabel(frame)).toEqual({ status: 'code', code: 'JR-03-0042' });
  });

  it('finds nothing in a frame with no QR code', () => {
    expect(decodeLabel(blankFrame(320, 240))).toEqual({ status: 'nothing' });
  });

  it('tells a QR code that is not a sample label (a pile code) from a label', () => {
    expect(decodeLabel(frameOf('label-qr-pile-code.png'))).toEqual({ status: 'not-a-label', text: 'JR-03-P0042' });
  });
});
