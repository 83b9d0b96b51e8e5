import { estimatePile, panTestGrade, type PileEstimate, type Result } from '../../../../shared/engine';
import type { PanTestData, PileData, SampleData } from '../../../../shared/sync/protocol';

/** What the device holds of a record: the data and whether it was deleted. */
type Held<T> = T & { readonly deletedAt?: string | null };

/** One sample's grade as the device can work it out: from its latest pan test only (the device holds no assays). */
export interface DeviceSampleGrade {
  readonly sampleId: string;
  readonly code: string;
  readonly sampleType: SampleData['sampleType'];
  readonly gradeGpt: number | null;
  readonly gradeSource: 'pan' | null;
}

/**
 * The estimate made on the device, with the per-sample grades it used and how many samples had no
 * grade. The page says in words (in the reader's language) that these grades are pan estimates only
 * and how many samples were left out; the estimate's own assumptions are the engine's.
 */
export interface DeviceEstimate {
  readonly estimate: PileEstimate;
  readonly sampleGrades: readonly DeviceSampleGrade[];
  readonly ungradedCount: number;
}

/**
 * The pile's estimate from what the device holds, by the same engine the server runs
 * (`panTestGrade`, then `estimatePile`) and with the server's rules: a sample's latest live pan
 * test, panned at the sample's moisture; samples with no grade are left out and counted. The device
 * holds no assays and no site calibration, so every grade here is a plain pan estimate, and the
 * server's figure may differ once assays or calibration apply.
 */
export function estimateOnDevice(
  pile: Held<PileData>,
  samples: readonly Held<SampleData>[],
  panTests: readonly Held<PanTestData>[],
): Result<DeviceEstimate> {
  const liveSamples = samples.filter((sample) => !sample.deletedAt && sample.pileId === pile.id).sort((a, b) => a.code.localeCompare(b.code));
  const latestPanTest = new Map<string, Held<PanTestData>>();
  for (const panTest of panTests) {
    if (panTest.deletedAt) continue;
    const known = latestPanTest.get(panTest.sampleId);
    // Latest by test time, then the lower id, as the server orders them.
    if (!known || panTest.testedAt > known.testedAt || (panTest.testedAt === known.testedAt && panTest.id < known.id)) {
      latestPanTest.set(panTest.sampleId, panTest);
    }
  }
  const sampleGrades: DeviceSampleGrade[] = liveSamples.map((sample) => {
    const panTest = latestPanTest.get(sample.id);
    const grade = panTest
      ? panTestGrade({
        massPannedKg: panTest.massPannedKg, moisturePct: sample.moisturePct ?? 0, colours: panTest.colours,
        goldMassMg: panTest.goldMassMg ?? undefined, panEfficiency: panTest.panEfficiency ?? undefined,
      })
      : null;
    const gradeGpt = grade?.ok ? grade.value.gradeGpt : null;
    return { sampleId: sample.id, code: sample.code, sampleType: sample.sampleType, gradeGpt, gradeSource: gradeGpt === null ? null : 'pan' };
  });
  const counted = sampleGrades.filter((entry) => entry.gradeGpt !== null);
  const result = estimatePile(
    {
      material: pile.material, footprint: pile.footprint ?? undefined, heightM: pile.heightM ?? undefined, shapeModel: pile.shapeModel,
      angleOfReposeDeg: pile.angleOfReposeDeg, bulkDensityTPerM3: pile.bulkDensityTPerM3, moisturePct: pile.moisturePct,
      spotHeights: pile.spotHeights ?? undefined, sackCount: pile.sackCount ?? undefined, sackMassKg: pile.sackMassKg ?? undefined,
    },
    counted.map((entry) => ({ sampleId: entry.sampleId, sampleType: entry.sampleType, assayGpt: null, panGpt: entry.gradeGpt })),
  );
  if (!result.ok) {
    return result;
  }
  return { ok: true, value: { estimate: result.value, sampleGrades, ungradedCount: sampleGrades.length - counted.length } };
}
