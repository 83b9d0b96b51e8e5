import type { PanTestData, PileData, SampleData } from './protocol';

/** Valid records for the protocol specs; each spec changes what it tests. */
export const SITE_ID = '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b01';
export const PILE_ID = '0b6f3c2e-1a4d-4e8b-9c7d-000000000001';
export const SAMPLE_ID = '0b6f3c2e-1a4d-4e8b-9c7d-000000000002';
export const USER_ID = '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01';

export function aPile(overrides: Partial<PileData> = {}): PileData {
  return {
    id: PILE_ID, siteId: SITE_ID, code: 'JR-07-P0001', material: 'sluice-tailings',
    footprint: { type: 'Polygon', coordinates: [[[33.45, -4.05], [33.4502, -4.05], [33.4502, -4.0502], [33.45, -4.05]]] },
    heightM: 2.5, shapeModel: 'cone', angleOfReposeDeg: 34, bulkDensityTPerM3: null, moisturePct: 8,
    spotHeights: null, sackCount: null, sackMassKg: null, hazards: ['mercury'], notes: '', ...overrides,
  };
}

export function aSample(overrides: Partial<SampleData> = {}): SampleData {
  return {
    id: SAMPLE_ID, pileId: PILE_ID, code: 'JR-07-0001', sampleType: 'routine', duplicateOfId: null, standardId: null,
    location: { type: 'Point', coordinates: [33.4501, -4.0501] }, gpsAccuracyM: 4, wetMassKg: 12.5, moisturePct: 9,
    increments: 8, position: 'toe', collectedAt: '2025-03-04T08:15:00.000Z', collectorId: USER_ID, deviceId: 'device-a', ...overrides,
  };
}

export function aPanTest(overrides: Partial<PanTestData> = {}): PanTestData {
  return {
    id: '0b6f3c2e-1a4d-4e8b-9c7d-000000000003', sampleId: SAMPLE_ID, massPannedKg: 2,
    colours: [{ sizeClass: 'fine', count: 12 }], goldMassMg: null, panEfficiency: null,
    testedAt: '2025-03-04T09:00:00.000Z', ...overrides,
  };
}
