import { aPanTest, aPile, aSample } from './fixtures.spec-helper';
import { parseEntityData, pushRequestSchema, pullQuerySchema, MAX_PUSH_BATCH } from './protocol';

describe('parseEntityData', () => {
  it('accepts a complete pile in the API field names', () => {
    expect(parseEntityData('pile', aPile())).toEqual({ ok: true, data: aPile() });
  });

  it('refuses a pile whose footprint ring does not close, naming the field', () => {
    const open = aPile({ footprint: { type: 'Polygon', coordinates: [[[33.45, -4.05], [33.4502, -4.05], [33.4502, -4.0502], [33.4503, -4.0503]]] } });
    const result = parseEntityData('pile', open);
    expect(result).toEqual({ ok: false, errors: [expect.objectContaining({ path: 'footprint', message: 'The footprint ring must end where it starts' })] });
  });

  it('refuses a pile field it does not know, so a misspelt name is never dropped silently', () => {
    const result = parseEntityData('pile', { ...aPile(), heigthM: 3 });
    expect(result.ok).toBe(false);
  });

  it('refuses a cone with no height and a pile of sacks with no sack count', () => {
    expect(parseEntityData('pile', aPile({ heightM: null }))).toMatchObject({ ok: false, errors: [{ path: 'heightM' }] });
    expect(parseEntityData('pile', aPile({ shapeModel: 'sacks', heightM: null }))).toMatchObject({ ok: false, errors: [{ path: 'sackCount' }] });
  });

  it('refuses a hazard outside the safety vocabulary', () => {
    expect(parseEntityData('pile', { ...aPile(), hazards: ['snakes'] }).ok).toBe(false);
  });

  it('refuses a field duplicate that does not say which sample it duplicates', () => {
    expect(parseEntityData('sample', aSample({ sampleType: 'duplicate' }))).toMatchObject({ ok: false, errors: [{ path: 'duplicateOfId' }] });
  });

  it('refuses a reference standard with no standard named', () => {
    expect(parseEntityData('sample', aSample({ sampleType: 'standard' }))).toMatchObject({ ok: false, errors: [{ path: 'standardId' }] });
  });

  it('refuses a sample code that is not SITE-DEVICE-SEQ', () => {
    expect(parseEntityData('sample', aSample({ code: 'sample 1' }))).toMatchObject({ ok: false, errors: [{ path: 'code' }] });
  });

  it('refuses a pan test that lists one size class twice', () => {
    const twice = aPanTest({ colours: [{ sizeClass: 'fine', count: 1 }, { sizeClass: 'fine', count: 2 }] });
    expect(parseEntityData('panTest', twice)).toMatchObject({ ok: false, errors: [{ path: 'colours' }] });
  });

  it('refuses a pan efficiency of zero, which would divide by zero in the grade', () => {
    expect(parseEntityData('panTest', aPanTest({ panEfficiency: 0 })).ok).toBe(false);
  });
});

describe('pushRequestSchema', () => {
  const mutation = { mutationId: '0b6f3c2e-1a4d-4e8b-9c7d-00000000aaaa', entity: 'pile', id: aPile().id, op: 'upsert', baseRevision: null, data: aPile() };

  it('accepts a batch of mutations and leaves each data for its own check', () => {
    expect(pushRequestSchema.safeParse({ deviceId: 'device-a', mutations: [{ ...mutation, data: { anything: true } }] }).success).toBe(true);
  });

  it('refuses an empty batch and one over the batch limit', () => {
    expect(pushRequestSchema.safeParse({ deviceId: 'device-a', mutations: [] }).success).toBe(false);
    const tooMany = Array.from({ length: MAX_PUSH_BATCH + 1 }, () => mutation);
    expect(pushRequestSchema.safeParse({ deviceId: 'device-a', mutations: tooMany }).success).toBe(false);
  });

  it('refuses an entity that does not sync', () => {
    expect(pushRequestSchema.safeParse({ deviceId: 'device-a', mutations: [{ ...mutation, entity: 'user' }] }).success).toBe(false);
  });
});

describe('pullQuerySchema', () => {
  it('reads the cursor and limit from query strings, with defaults', () => {
    expect(pullQuerySchema.parse({ since: '42', limit: '10' })).toEqual({ since: 42, limit: 10 });
    expect(pullQuerySchema.parse({})).toEqual({ since: 0, limit: 200 });
  });

  it('refuses a negative cursor and a limit over the page maximum', () => {
    expect(pullQuerySchema.safeParse({ since: '-1' }).success).toBe(false);
    expect(pullQuerySchema.safeParse({ limit: '100000' }).success).toBe(false);
  });
});
