import { checkBlank, checkDuplicatePair, checkStandard, checkStandardSeries, parseAssayValue, valueForStatistics } from './qaqc';
import { unwrap } from './result';

const value = (raw: string, limit?: number) => unwrap(parseAssayValue(raw, limit));

describe('parseAssayValue', () => {
  it('reads plain numbers, below-detection and above-range values', () => {
    expect(value('0.53')).toMatchObject({ valueGpt: 0.53, isBelowDetection: false, isAboveRange: false });
    expect(value(' < 0.01 ')).toMatchObject({ valueGpt: 0.01, isBelowDetection: true, detectionLimitGpt: 0.01 });
    expect(value('>100')).toMatchObject({ valueGpt: 100, isAboveRange: true });
    expect(value('0.004', 0.005)).toMatchObject({ isBelowDetection: true, detectionLimitGpt: 0.005 });
    expect(value('1e-2').valueGpt).toBe(0.01);
  });

  it.each([['', 'empty'], ['abc', 'not-parseable'], ['0,53', 'not-parseable'], ['-0.2', 'not-parseable'], ['<0', 'not-positive']])('refuses "%s"', (raw, code) => {
    const result = parseAssayValue(raw);
    expect(!result.ok && result.errors[0].code).toBe(code);
  });

  it('turns a censored value into a number by the stated convention, never a silent zero by default', () => {
    // Miesch 1967 (USGS PP 574-B): censored values; half the limit is common practice, no source
    const censored = value('<0.01');
    expect(valueForStatistics(censored)).toBe(0.005);
    expect(valueForStatistics(censored, 'detection-limit')).toBe(0.01);
    expect(valueForStatistics(censored, 'zero')).toBe(0);
    expect(valueForStatistics(value('0.8'))).toBe(0.8);
  });
});

describe('checkDuplicatePair', () => {
  it('computes HARD = |a − b|/(a + b) and passes within tolerance', () => {
    // Abzalov 2008: HARD = |a − b| / (a + b); 1.0 and 1.5 → 0.2
    const result = unwrap(checkDuplicatePair({ original: value('1.0'), duplicate: value('1.5') }));
    expect(result.hard).toBeCloseTo(0.2, 12);
    expect(result.relativeDifference).toBeCloseTo(0.4, 12);
    expect(result.status).toBe('pass');
  });

  it('fails a pair beyond a configurable tolerance', () => {
    expect(unwrap(checkDuplicatePair({ original: value('1.0'), duplicate: value('1.5'), tolerance: 0.1 })).status).toBe('fail');
    expect(unwrap(checkDuplicatePair({ original: value('1'), duplicate: value('3') })).status).toBe('fail');
  });

  it('passes two below-detection values and notes one', () => {
    expect(unwrap(checkDuplicatePair({ original: value('<0.01'), duplicate: value('<0.01') })).note).toBe('both below detection');
    expect(unwrap(checkDuplicatePair({ original: value('<0.01'), duplicate: value('0.006') })).note).toContain('half the limit');
  });

  it('refuses a tolerance outside (0, 1]', () => {
    expect(checkDuplicatePair({ original: value('1'), duplicate: value('1'), tolerance: 0 }).ok).toBe(false);
  });
});

describe('checkBlank', () => {
  it('fails a blank above five times the detection limit', () => {
    // common practice (REFERENCES.md): a blank above about 5× the detection limit fails
    expect(unwrap(checkBlank({ value: value('0.06'), detectionLimitGpt: 0.01 })).status).toBe('fail');
    expect(unwrap(checkBlank({ value: value('0.04'), detectionLimitGpt: 0.01 })).status).toBe('pass');
    expect(unwrap(checkBlank({ value: value('<0.01'), detectionLimitGpt: 0.01 })).status).toBe('pass');
    expect(unwrap(checkBlank({ value: value('0.04'), detectionLimitGpt: 0.01, multiple: 3 })).status).toBe('fail');
  });

  it('refuses a zero detection limit', () => {
    expect(checkBlank({ value: value('0.04'), detectionLimitGpt: 0 }).ok).toBe(false);
  });
});

describe('checkStandard', () => {
  // Westgard-style control rules (as in REFERENCES.md): ±2 SD warn, ±3 SD fail, two in a row beyond 2 SD fail
  it.each([
    ['1.00', 'pass'],
    ['1.09', 'pass'],
    ['1.12', 'warn'],
    ['0.87', 'warn'],
    ['1.16', 'fail'],
  ])('rates %s against 1.00 ± 0.05 as %s', (raw, status) => {
    expect(unwrap(checkStandard({ value: value(raw), expectedGpt: 1, sdGpt: 0.05 })).status).toBe(status);
  });

  it('fails the second of two results beyond 2 SD on the same side', () => {
    const checks = unwrap(checkStandardSeries({ values: [value('1.12'), value('1.13'), value('0.88')], expectedGpt: 1, sdGpt: 0.05 }));
    expect(checks.map((check) => check.status)).toEqual(['warn', 'fail', 'warn']);
  });

  it('refuses a zero SD', () => {
    expect(checkStandard({ value: value('1'), expectedGpt: 1, sdGpt: 0 }).ok).toBe(false);
    expect(checkStandardSeries({ values: [value('1')], expectedGpt: -1, sdGpt: 0.1 }).ok).toBe(false);
  });
});
