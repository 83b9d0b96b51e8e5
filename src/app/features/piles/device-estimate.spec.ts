import { estimatePile } from '../../../../shared/engine';
import type { PanTestData, PileData, SampleData } from '../../../../shared/sync/protocol';
import { estimateOnDevice } from './device-estimate';

const PILE_ID = '00000000-0000-4000-8000-000000000001';
const pile: PileData = {
  id: PILE_ID, siteId: '00000000-0000-4000-8000-0000000000aa', code: 'JR-07-P0001', material: 'sluice-tailings', footprint: null,
  heightM: 2, shapeModel: 'sacks', angleOfReposeDeg: null, bulkDensityTPerM3: null, moisturePct: null, spotHeights: null,
  sackCount: 40, sackMassKg: 50, hazards: [], notes: '',
};

function sample(index: number, changes: Partial<SampleData> & { deletedAt?: string | null } = {}) {
  return {
    id: `00000000-0000-4000-8000-00000000010${index}`, pileId: PILE_ID, code: `JR-07-000${index}`, sampleType: 'routine' as const, duplicateOfId: null, standardId: null,
    location: null, gpsAccuracyM: null, wetMassKg: 10, moisturePct: null, increments: 4, position: 'toe', collectedAt: '2026-03-01T08:00:00.000Z',
    collectorId: null, deviceId: 'device', deletedAt: null, ...changes,
  } as unknown as SampleData & { deletedAt: string | null };
}

function panTest(sampleIndex: number, goldMassMg: number, testedAt = '2026-03-01T09:00:00.000Z', id = `00000000-0000-4000-8000-00000000020${sampleIndex}`) {
  return { id, sampleId: `00000000-0000-4000-8000-00000000010${sampleIndex}`, massPannedKg: 10, colours: [], goldMassMg, panEfficiency: 1, testedAt, deletedAt: null } as PanTestData & { deletedAt: string | null };
}

describe('estimateOnDevice', () => {
  it('gives the same tonnes and grade statistics as the engine fed the pan grades directly (10 mg in 10 kg at efficiency 1 is 1 g/t)', () => {
    const result = estimateOnDevice(pile, [sample(1), sample(2), sample(3)], [panTest(1, 10), panTest(2, 20), panTest(3, 30)]);
    const direct = estimatePile({ material: 'sluice-tailings', shapeModel: 'sacks', sackCount: 40, sackMassKg: 50, heightM: 2 }, [1, 2, 3].map((grade, index) => ({ sampleId: `s${index}`, sampleType: 'routine' as const, assayGpt: null, panGpt: grade })));
    expect(result.ok && direct.ok).toBe(true);
    const estimate = result.ok ? result.value.estimate : null;
    expect(estimate?.dryTonnes).toBe(direct.ok ? direct.value.dryTonnes : NaN);
    expect(estimate?.grade?.meanGpt).toBeCloseTo(2, 10);
    expect(estimate?.grade?.n).toBe(3);
    expect(result.ok ? result.value.sampleGrades.map((entry) => [entry.code, entry.gradeGpt, entry.gradeSource]) : []).toEqual([['JR-07-0001', 1, 'pan'], ['JR-07-0002', 2, 'pan'], ['JR-07-0003', 3, 'pan']]);
  });

  it('uses each sample\'s latest live pan test and leaves out deleted samples and pan tests', () => {
    const result = estimateOnDevice(
      pile,
      [sample(1), sample(2, { deletedAt: '2026-03-03T00:00:00.000Z' })],
      [panTest(1, 10, '2026-03-01T09:00:00.000Z', '00000000-0000-4000-8000-000000000301'), panTest(1, 40, '2026-03-02T09:00:00.000Z', '00000000-0000-4000-8000-000000000302'), { ...panTest(1, 90, '2026-03-04T09:00:00.000Z', '00000000-0000-4000-8000-000000000303'), deletedAt: '2026-03-05T00:00:00.000Z' }, panTest(2, 20)],
    );
    expect(result.ok ? result.value.sampleGrades.map((entry) => entry.gradeGpt) : []).toEqual([4]);
  });

  it('counts samples with no pan test and leaves them out of the grade', () => {
    const result = estimateOnDevice(pile, [sample(1), sample(2)], [panTest(1, 10)]);
    expect(result.ok ? result.value.ungradedCount : NaN).toBe(1);
    expect(result.ok ? result.value.estimate.grade?.n : NaN).toBe(1);
    expect(estimateOnDevice(pile, [sample(1)], [panTest(1, 10)])).toMatchObject({ ok: true, value: { ungradedCount: 0 } });
  });

  it('answers the engine\'s refusal when the pile cannot be estimated', () => {
    const result = estimateOnDevice({ ...pile, shapeModel: 'cone', sackCount: null, sackMassKg: null }, [], []);
    expect(result.ok).toBe(false);
  });
});
