import { TestBed } from '@angular/core/testing';
import { TranslocoService } from '@jsverse/transloco';
import { checkImageCorners, type CornersCheck } from './image-corners';

const CAMP = { west: '33.4510', south: '-4.0520', east: '33.4525', north: '-4.0505' };

/** The English words of each refusal, as the form shows them. */
function words(check: CornersCheck): Record<string, string> {
  const transloco = TestBed.inject(TranslocoService);
  return Object.fromEntries(Object.entries(check.ok ? {} : check.errors).map(([field, problem]) => [field, transloco.translate(problem.key, problem.params)]));
}

describe('checkImageCorners', () => {
  it('accepts four corners of a small north-up box and answers them as numbers', () => {
    expect(checkImageCorners(CAMP)).toEqual({ ok: true, value: { west: 33.451, south: -4.052, east: 33.4525, north: -4.0505 } });
  });

  it('asks for each missing corner', () => {
    const check = checkImageCorners({ ...CAMP, north: '', west: '  ' });
    expect(check.ok).toBe(false);
    expect(words(check)).toEqual({ north: 'Type the north edge in degrees (latitude)', west: 'Type the west edge in degrees (longitude)' });
  });

  it('refuses words, commas as decimal marks and degrees-minutes text', () => {
    const check = checkImageCorners({ ...CAMP, west: '33,4510', south: '4°03\'S' });
    expect(words(check)).toEqual({
      west: 'Longitude in decimal degrees, with a point, e.g. 33.4518',
      south: 'Latitude in decimal degrees, with a point, e.g. -4.0512',
    });
  });

  it('refuses latitudes beyond the map\'s ±85° and longitudes beyond ±180°', () => {
    const check = checkImageCorners({ west: '-181', south: '-86', east: '33', north: '-4' });
    expect(words(check)).toEqual({ west: 'Longitude must be between -180° and 180°', south: 'Latitude must be between -85° and 85°' });
  });

  it('refuses corners typed the wrong way round', () => {
    const check = checkImageCorners({ west: CAMP.east, east: CAMP.west, south: CAMP.north, north: CAMP.south });
    expect(words(check)).toEqual({
      east: 'The east edge must be greater than the west edge (east of it)',
      north: 'The north edge must be greater than the south edge (south latitudes are negative)',
    });
  });

  it('refuses a box larger than half a degree each way, as the server does', () => {
    const check = checkImageCorners({ ...CAMP, east: '34.0', north: '-3.5' });
    expect(words(check)).toEqual({
      east: 'The image may span at most 0.5° from west to east; check the corners',
      north: 'The image may span at most 0.5° from south to north; check the corners',
    });
  });
});
