import fc from 'fast-check';
import { nextRetryDelay, RETRY_BASE_MS, RETRY_CAP_MS } from './next-retry-delay';

describe('nextRetryDelay', () => {
  it('waits between one and two seconds before the first retry', () => {
    expect(nextRetryDelay(1, 0)).toBe(RETRY_BASE_MS / 2);
    expect(nextRetryDelay(1, 0.999999)).toBeLessThanOrEqual(RETRY_BASE_MS);
  });

  it('doubles the step with each attempt', () => {
    expect(nextRetryDelay(2, 0)).toBe(RETRY_BASE_MS);
    expect(nextRetryDelay(3, 0)).toBe(2 * RETRY_BASE_MS);
  });

  it('never waits longer than the cap, even after many attempts', () => {
    expect(nextRetryDelay(1000, 0.999999)).toBeLessThanOrEqual(RETRY_CAP_MS);
    expect(nextRetryDelay(1000, 0)).toBe(RETRY_CAP_MS / 2);
  });

  it('for any attempt and draw, stays within half the step and the cap', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 200 }), fc.double({ min: 0, max: 1, maxExcluded: true, noNaN: true }), (attempt, random) => {
      const delay = nextRetryDelay(attempt, random);
      expect(delay).toBeGreaterThanOrEqual(RETRY_BASE_MS / 2);
      expect(delay).toBeLessThanOrEqual(RETRY_CAP_MS);
    }));
  });

  it('refuses an attempt number below one as a programming error', () => {
    expect(() => nextRetryDelay(0, 0.5)).toThrow(RangeError);
  });
});
