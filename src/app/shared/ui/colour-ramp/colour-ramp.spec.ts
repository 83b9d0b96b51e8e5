import { oklabToRgb, rampRgb, rampTable, RAMP_STEPS } from './colour-ramp';

/** Relative luminance of 8-bit sRGB (WCAG 2.x definition). */
function luminance([red, green, blue]: readonly number[]): number {
  const linear = (channel: number) => {
    const value = channel / 255;
    return value <= 0.04045 ? value / 12.92 : ((value + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * linear(red) + 0.7152 * linear(green) + 0.0722 * linear(blue);
}

describe('the grade colour ramp', () => {
  it('maps OKLab white and black to sRGB white and black', () => {
    expect(oklabToRgb(1, 0, 0)).toEqual([255, 255, 255]);
    expect(oklabToRgb(0, 0, 0)).toEqual([0, 0, 0]);
  });

  it('gets darker at every step from low grade to high grade, so it reads without colour', () => {
    const table = rampTable();
    let previous = Infinity;
    for (let step = 0; step < RAMP_STEPS; step += 8) {
      const current = luminance([table[step * 3], table[step * 3 + 1], table[step * 3 + 2]]);
      expect(current).toBeLessThan(previous);
      previous = current;
    }
  });

  it('clamps positions outside 0…1 and treats NaN as the low end', () => {
    expect(rampRgb(-1)).toEqual(rampRgb(0));
    expect(rampRgb(2)).toEqual(rampRgb(1));
    expect(rampRgb(Number.NaN)).toEqual(rampRgb(0));
  });
});
