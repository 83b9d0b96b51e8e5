/**
 * A site's live samples and their pan estimates, read once per data revision and kept in process.
 *
 * The review desk, the site map and the shortlist all need every sample of a site with its pan
 * estimate. Reading 20,000 samples and 10,000 pan tests as Sequelize instances took seconds per
 * request; raw rows take tens of milliseconds, and this table keeps them until the data revision
 * (`readDataRevision`) moves, which every write of a sample or pan test does in its own
 * transaction. Assays and the calibration switch live in the lab loop's tables, which do not move
 * that revision, so they are read fresh on every request (`site-grades.ts`).
 */
import { panTestGrade, type EngineWarning } from '../../shared/engine';
import type { PanTestData, SampleData } from '../../shared/sync/protocol';
import { SAMPLE_VIEW_COLUMNS, sampleViewOfRow, type RecordView } from '../capture/capture.repository';
import { RevisionCache, perDatabase, readDataRevision } from '../capture/data-revision';
import { PanTest } from '../capture/pan-test.model';
import { Sample } from '../capture/sample.model';

/** A sample's pan estimate from its latest live pan test (null grade: the test could not be read). */
export interface PanEstimate {
  readonly panGpt: number | null;
  readonly warnings: readonly EngineWarning[];
}

/** The live samples of one site at one data revision. */
export interface SiteSampleTable {
  readonly siteId: string;
  readonly revision: number;
  /** Newest first (`collectedAt` descending, then code), as the read routes list them. */
  readonly newestFirst: readonly RecordView<SampleData>[];
  /** The same samples by code: the order pile grades and the calibration are worked in. */
  readonly byCode: readonly RecordView<SampleData>[];
  /** Pan estimates by sample id, for the samples that have a live pan test. */
  readonly pans: ReadonlyMap<string, PanEstimate>;
}

/** A few sites at a time: each table of 20,000 samples holds some tens of megabytes. */
const SITES_KEPT = 4;
const tables = perDatabase(() => new RevisionCache<SiteSampleTable>(SITES_KEPT));

/** The site's table at the current data revision, read from the database only when the revision moved. */
export async function siteSampleTable(siteId: string): Promise<SiteSampleTable> {
  const revision = await readDataRevision();
  return tables().get(siteId, revision, () => readSiteSampleTable(siteId, revision));
}

async function readSiteSampleTable(siteId: string, revision: number): Promise<SiteSampleTable> {
  const where = { siteId, deletedAt: null };
  const [rows, codeOrder, panRows] = await Promise.all([
    Sample.findAll({ attributes: [...SAMPLE_VIEW_COLUMNS], where, order: [['collectedAt', 'DESC'], ['code', 'ASC']], raw: true }),
    // The database's own order of codes (its collation), not JavaScript's.
    Sample.findAll({ attributes: ['id'], where, order: [['code', 'ASC']], raw: true }),
    PanTest.findAll({
      attributes: ['id', 'sampleId', 'massPannedKg', 'colours', 'goldMassMg', 'panEfficiency'], where,
      order: [['testedAt', 'DESC'], ['id', 'ASC']], raw: true,
    }),
  ]);
  const newestFirst = (rows as unknown as Record<string, unknown>[]).map(sampleViewOfRow);
  const byId = new Map(newestFirst.map((sample) => [sample.id, sample]));
  const byCode = (codeOrder as unknown as { id: string }[]).flatMap((row) => byId.get(row.id) ?? []);
  return { siteId, revision, newestFirst, byCode, pans: panEstimates(byId, panRows as unknown as Record<string, unknown>[]) };
}

/**
 * Each sample's latest live pan test (testedAt descending, then id: the first row of a sample)
 * through the engine's `panTestGrade`, with the sample's moisture as the moisture of the panned
 * material, exactly as the lab loop's `panEstimatesBySample` does it.
 */
function panEstimates(samples: ReadonlyMap<string, SampleData>, rows: readonly Record<string, unknown>[]): Map<string, PanEstimate> {
  const estimates = new Map<string, PanEstimate>();
  for (const row of rows) {
    const sample = samples.get(row['sampleId'] as string);
    if (!sample || estimates.has(sample.id)) {
      continue;
    }
    const colours = (typeof row['colours'] === 'string' ? JSON.parse(row['colours']) : row['colours']) as PanTestData['colours'];
    const grade = panTestGrade({
      massPannedKg: row['massPannedKg'] as number, moisturePct: sample.moisturePct ?? 0, colours,
      goldMassMg: (row['goldMassMg'] as number | null) ?? undefined, panEfficiency: (row['panEfficiency'] as number | null) ?? undefined,
    });
    estimates.set(sample.id, grade.ok
      ? { panGpt: grade.value.gradeGpt, warnings: grade.value.warnings }
      : { panGpt: null, warnings: grade.errors.map((error) => ({ code: error.code, message: error.message })) });
  }
  return estimates;
}
