import { PHOTO_LONG_SIDE_PX, THUMBNAIL_LONG_SIDE_PX, fitLongSide } from './photo-resize';

describe('fitLongSide', () => {
  it('brings a 4000 × 3000 camera picture down to 1600 × 1200', () => {
    expect(fitLongSide(4000, 3000, PHOTO_LONG_SIDE_PX)).toEqual({ width: 1600, height: 1200 });
  });

  it('brings a portrait picture down by its height', () => {
    expect(fitLongSide(3024, 4032, PHOTO_LONG_SIDE_PX)).toEqual({ width: 1200, height: 1600 });
  });

  it('keeps the long side at or under the limit for awkward sizes', () => {
    for (const [width, height] of [[4001, 2999], [1601, 1601], [9999, 17], [17, 9999]]) {
      const fitted = fitLongSide(width, height, PHOTO_LONG_SIDE_PX);
      expect(Math.max(fitted.width, fitted.height)).toBeLessThanOrEqual(PHOTO_LONG_SIDE_PX);
      expect(Math.min(fitted.width, fitted.height)).toBeGreaterThanOrEqual(1);
    }
  });

  it('never enlarges a picture already small enough', () => {
    expect(fitLongSide(640, 480, PHOTO_LONG_SIDE_PX)).toEqual({ width: 640, height: 480 });
  });

  it('makes the list thumbnail 240 px on its long side', () => {
    expect(fitLongSide(1600, 1200, THUMBNAIL_LONG_SIDE_PX)).toEqual({ width: 240, height: 180 });
  });
});
