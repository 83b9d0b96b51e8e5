import { makeHumanCode, parseHumanCode } from './human-code';

describe('makeHumanCode', () => {
  it('makes SITE-DEVICE-SEQ with a zero-padded device and sequence', () => {
    expect(makeHumanCode({ siteCode: 'NH', deviceNumber: 7, sequence: 42, kind: 'sample' })).toBe('NH-07-0042');
  });

  it('marks pile codes with P before the sequence so they never look like samples', () => {
    expect(makeHumanCode({ siteCode: 'JR', deviceNumber: 12, sequence: 3, kind: 'pile' })).toBe('JR-12-P0003');
  });

  it('gives two devices different codes for the same sequence', () => {
    const first = makeHumanCode({ siteCode: 'JR', deviceNumber: 1, sequence: 5, kind: 'sample' });
    const second = makeHumanCode({ siteCode: 'JR', deviceNumber: 10, sequence: 5, kind: 'sample' });
    expect(first).not.toBe(second);
  });

  it('refuses a device number of zero and a lower-case site code', () => {
    expect(() => makeHumanCode({ siteCode: 'JR', deviceNumber: 0, sequence: 1, kind: 'sample' })).toThrow(RangeError);
    expect(() => makeHumanCode({ siteCode: 'jr', deviceNumber: 1, sequence: 1, kind: 'sample' })).toThrow(RangeError);
    expect(() => makeHumanCode({ siteCode: 'JR', deviceNumber: 1, sequence: 0, kind: 'sample' })).toThrow(RangeError);
  });
});

describe('parseHumanCode', () => {
  it('reads back what makeHumanCode made', () => {
    const parts = { siteCode: 'IF', deviceNumber: 103, sequence: 999, kind: 'pile' as const };
    expect(parseHumanCode(makeHumanCode(parts))).toEqual(parts);
  });

  it('answers null for text that is not a code', () => {
    expect(parseHumanCode('pile by the road')).toBeNull();
  });
});
