/**
 * A seeded synthetic site for the benchmarks: site `SY` ("Synthetic dumps") in the demo
 * cooperative with, at full size, 50 piles, 20,000 samples (half with a pan test) and 2,000 photo
 * records, pushed through the sync service in batches the way a device would send them, so the
 * change log, revisions and grades are exactly what real captures produce. The same seed gives the
 * same records (ids included). The geologist, manager and admin of the demo are members.
 *
 * As a command: `npx tsx scripts/make-synthetic-site.ts DATA_DIR [smoke|full]` migrates and seeds
 * the demo in DATA_DIR (SQLite) first, then adds the site.
 */
import { createHash, randomUUID } from 'node:crypto';
import { join } from 'node:path';
import { Membership } from '../server/accounts/membership.model';
import type { CurrentUser } from '../server/accounts/current-user';
import { openDatabase, type Database } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrator';
import { initModels } from '../server/db/models';
import { seedDemo } from '../server/demo/seed-demo';
import { ensureDataDir, loadConfig } from '../server/lib/config';
import { DEMO_ORGANIZATION, DEMO_PEOPLE } from '../server/demo/demo-scenario';
import { Site } from '../server/sites/site.model';
import { SyncService } from '../server/sync/sync.service';
import { seededRandom } from '../shared/engine';
import { makeHumanCode } from '../shared/sync/human-code';
import { PILE_MATERIALS, type Mutation, type PanTestData, type PhotoData, type PileData, type SampleData } from '../shared/sync/protocol';

/** How big a synthetic site is. */
export interface SyntheticSize {
  readonly piles: number;
  readonly samples: number;
  readonly photos: number;
}

/** The site (full) and a tenth of it for CI smoke runs. */
export const SYNTHETIC_SIZES: Readonly<Record<'smoke' | 'full', SyntheticSize>> = {
  full: { piles: 50, samples: 20_000, photos: 2_000 },
  smoke: { piles: 10, samples: 2_000, photos: 200 },
};

/** The synthetic site's fixed identity (invented, near the demo sites). */
export const SYNTHETIC_SITE = { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b99', code: 'SY', name: 'Synthetic dumps', processingLat: -4.071, processingLon: 33.48 } as const;

/** Mutations per push: the size a device sends at camp. */
const BATCH = 1000;
const METRES_PER_DEGREE = 111_320;

/** A UUID (version 5 layout) derived from the seed and a name, so the site is reproducible. */
function syntheticUuid(seed: number, name: string): string {
  const hash = createHash('sha1').update(`synthetic/${seed}/${name}`).digest();
  hash[6] = (hash[6] & 0x0f) | 0x50;
  hash[8] = (hash[8] & 0x3f) | 0x80;
  const hex = hash.subarray(0, 16).toString('hex');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20, 32)}`;
}

function offset([lon, lat]: readonly [number, number], eastM: number, northM: number): [number, number] {
  const round = (value: number) => Math.round(value * 1e7) / 1e7;
  return [round(lon + eastM / (METRES_PER_DEGREE * Math.cos((lat * Math.PI) / 180))), round(lat + northM / METRES_PER_DEGREE)];
}

/** The records of the site, parents first (pure: the same seed and size give the same records). */
export function buildSyntheticSite(size: SyntheticSize, seed: number, collectorId: string, deviceId: string, deviceNumber: number) {
  const random = seededRandom(seed);
  const piles: PileData[] = [];
  const samples: SampleData[] = [];
  const panTests: PanTestData[] = [];
  const photos: PhotoData[] = [];
  const centre: [number, number] = [SYNTHETIC_SITE.processingLon, SYNTHETIC_SITE.processingLat];
  const columns = Math.ceil(Math.sqrt(size.piles));
  const start = Date.UTC(2025, 0, 6, 7, 0, 0);
  for (let pileIndex = 0; pileIndex < size.piles; pileIndex += 1) {
    // Piles on a 120 m grid around the processing point, each a walked heptagon of 10-25 m radius.
    const pileCentre = offset(centre, ((pileIndex % columns) - columns / 2) * 120, (Math.floor(pileIndex / columns) - columns / 2) * 120);
    const radiusM = 10 + 15 * random();
    const ring: [number, number][] = [];
    for (let corner = 0; corner < 7; corner += 1) {
      const angle = (corner / 7) * 2 * Math.PI;
      ring.push(offset(pileCentre, Math.cos(angle) * radiusM, Math.sin(angle) * radiusM));
    }
    ring.push(ring[0]);
    piles.push({
      id: syntheticUuid(seed, `pile/${pileIndex}`), siteId: SYNTHETIC_SITE.id, code: makeHumanCode({ siteCode: SYNTHETIC_SITE.code, deviceNumber, sequence: pileIndex + 1, kind: 'pile' }),
      material: PILE_MATERIALS[pileIndex % PILE_MATERIALS.length], footprint: { type: 'Polygon', coordinates: [ring] }, heightM: Math.round((1.5 + 2.5 * random()) * 10) / 10,
      shapeModel: 'cone', angleOfReposeDeg: 34, bulkDensityTPerM3: null, moisturePct: 10, spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: 'synthetic pile',
    });
  }
  for (let index = 0; index < size.samples; index += 1) {
    const pile = piles[index % piles.length];
    const pileCentre = pile.footprint?.coordinates[0][0] as [number, number];
    const sample: SampleData = {
      id: syntheticUuid(seed, `sample/${index}`), pileId: pile.id, code: makeHumanCode({ siteCode: SYNTHETIC_SITE.code, deviceNumber, sequence: index + 1, kind: 'sample' }),
      sampleType: 'routine', duplicateOfId: null, standardId: null,
      location: { type: 'Point', coordinates: offset(pileCentre, -20 * random(), 10 * (random() - 0.5)) }, gpsAccuracyM: Math.round((3 + 5 * random()) * 10) / 10,
      wetMassKg: Math.round((8 + 6 * random()) * 10) / 10, moisturePct: 10, increments: 8 + Math.floor(random() * 5), position: 'mid-slope, 0.5 m',
      collectedAt: new Date(start + index * 97_000).toISOString(), collectorId, deviceId,
    };
    samples.push(sample);
    if (index % 2 === 0) {
      // A weighed-gold pan test reading a lognormal grade around 1.5 g/t (Box-Muller).
      const normal = Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
      const gradeGpt = 1.5 * Math.exp(0.6 * normal);
      panTests.push({
        id: syntheticUuid(seed, `panTest/${index}`), sampleId: sample.id, massPannedKg: 6, colours: [], goldMassMg: Math.round(gradeGpt * 6 * 0.9 * 0.8 * 1000) / 1000,
        panEfficiency: 0.8, testedAt: new Date(start + index * 97_000 + 3_600_000).toISOString(),
      });
    }
  }
  for (let index = 0; index < size.photos; index += 1) {
    const sample = samples[Math.floor((index * samples.length) / size.photos)];
    photos.push({
      id: syntheticUuid(seed, `photo/${index}`), ownerEntity: 'sample', ownerId: sample.id, contentType: 'image/jpeg',
      originalWidth: 1600, originalHeight: 1200, byteSize: 240_000 + Math.floor(random() * 80_000), takenAt: sample.collectedAt,
    });
  }
  return { piles, samples, panTests, photos };
}

/**
 * Adds the synthetic site to a migrated database that holds the demo people, pushing its records
 * through the sync service as the demo geologist's device. Seeding again changes nothing.
 */
export async function makeSyntheticSite(database: Database, size: SyntheticSize, seed = 9): Promise<{ siteId: string; applied: number }> {
  const geologist = DEMO_PEOPLE.find((person) => person.role === 'geologist');
  if (!geologist) throw new Error('the demo people are missing: seed the demo first');
  if (!(await Site.findByPk(SYNTHETIC_SITE.id))) {
    await database.transaction(async (transaction) => {
      await Site.create({ ...SYNTHETIC_SITE, organizationId: DEMO_ORGANIZATION.id, economics: null }, { transaction });
      for (const person of DEMO_PEOPLE.filter((candidate) => ['geologist', 'manager', 'admin'].includes(candidate.role))) {
        await Membership.create({ id: randomUUID(), userId: person.id, siteId: SYNTHETIC_SITE.id }, { transaction });
      }
    });
  }
  const deviceId = 'synthetic-tablet-01';
  const memberships = await Membership.findAll({ where: { userId: geologist.id } });
  const user: CurrentUser = {
    id: geologist.id, organizationId: DEMO_ORGANIZATION.id, email: geologist.email, name: geologist.name, role: geologist.role, labName: null,
    siteIds: memberships.map((membership) => membership.siteId), deviceId,
  };
  const sync = new SyncService(database);
  const { deviceNumber } = await sync.registerDevice(user, deviceId);
  const records = buildSyntheticSite(size, seed, geologist.id, deviceId, deviceNumber);
  const mutation = (entity: Mutation['entity'], data: { id: string }): Mutation => ({
    mutationId: syntheticUuid(seed, `mutation/${entity}/${data.id}`), entity, id: data.id, op: 'upsert', baseRevision: null, data,
  });
  const mutations = [
    ...records.piles.map((pile) => mutation('pile', pile)),
    ...records.samples.map((sample) => mutation('sample', sample)),
    ...records.panTests.map((panTest) => mutation('panTest', panTest)),
    ...records.photos.map((photo) => mutation('photo', photo)),
  ];
  let applied = 0;
  for (let first = 0; first < mutations.length; first += BATCH) {
    const { results } = await sync.push(user, { deviceId, mutations: mutations.slice(first, first + BATCH) });
    const refused = results.filter((result) => result.status === 'rejected' || result.status === 'conflict');
    if (refused.length > 0) throw new Error(`synthetic site refused: ${JSON.stringify(refused.slice(0, 3))}`);
    applied += results.filter((result) => result.status === 'applied').length;
  }
  return { siteId: SYNTHETIC_SITE.id, applied };
}

/**
 * Makes DATA_DIR hold what the server creates in demo mode plus the synthetic site, so a benchmark
 * can start the built server on it (SQLite, as `npm start` runs).
 */
export async function seedSyntheticDataDir(dataDir: string, size: SyntheticSize): Promise<{ siteId: string; applied: number; ms: number }> {
  const started = Date.now();
  const config = loadConfig({ NODE_ENV: 'production', DATA_DIR: dataDir, LOG_LEVEL: 'silent', STATIC_DIR: join(dataDir, 'none'), JWT_SECRET: 'synthetic-site-secret-long-enough-for-hs256' });
  ensureDataDir(config);
  const database = await openDatabase(config);
  try {
    initModels(database.sequelize);
    await migrateToLatest(database);
    await seedDemo(database);
    const { siteId, applied } = await makeSyntheticSite(database, size);
    return { siteId, applied, ms: Date.now() - started };
  } finally {
    await database.close();
  }
}

async function main(): Promise<void> {
  const [dataDir, sizeName = 'full'] = process.argv.slice(2);
  if (!dataDir || (sizeName !== 'smoke' && sizeName !== 'full')) {
    throw new Error('usage: tsx scripts/make-synthetic-site.ts DATA_DIR [smoke|full]');
  }
  const { applied, ms } = await seedSyntheticDataDir(dataDir, SYNTHETIC_SIZES[sizeName]);
  process.stdout.write(`synthetic site SY in ${dataDir}: ${applied} records applied in ${(ms / 1000).toFixed(1)} s\n`);
}

if (require.main === module) {
  main().catch((error: unknown) => {
    process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
    process.exit(1);
  });
}
