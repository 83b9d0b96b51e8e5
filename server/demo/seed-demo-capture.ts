import { createHash } from 'node:crypto';
import { colourMassMg, nominalDiameterUm, normalQuantile, seededRandom } from '../../shared/engine';
import type { Hazard } from '../../shared/safety/cautions';
import type { Mutation, PanTestData, PileData, SampleData } from '../../shared/sync/protocol';
import { makeHumanCode } from '../../shared/sync/human-code';
import type { CurrentUser } from '../accounts/current-user';
import type { Database } from '../db/database';
import { SyncService } from '../sync/sync.service';
import { DEMO_ORGANIZATION, DEMO_PEOPLE, DEMO_SITES } from './demo-scenario';

/**
 * The invented field work of the demo: piles, samples and pan tests around the two demo sites'
 * processing points, written through the same sync push a device uses, so the change log carries
 * them and a device pulls them like anything a crew captured. Ids and mutation ids are derived
 * from names, so seeding again answers "duplicate" for every mutation and changes nothing.
 */

/** Pile shapes the demo lays out (a description, not a record). */
interface DemoPilePlan {
  readonly name: string;
  readonly material: PileData['material'];
  readonly shapeModel: PileData['shapeModel'];
  /** Where the pile lies from the processing point: compass bearing (°) and distance (m). */
  readonly bearingDeg: number;
  readonly distanceM: number;
  /** Rough width of the toe (m). */
  readonly acrossM: number;
  readonly heightM: number | null;
  readonly angleOfReposeDeg: number | null;
  readonly moisturePct: number;
  readonly hazards: readonly Hazard[];
  readonly notes: string;
  /** Median grade of the pile's samples (g/t) and the spread of their natural log. */
  readonly medianGpt: number;
  readonly logSpread: number;
  readonly routineSamples: number;
  readonly sacks?: { readonly count: number; readonly massKg: number };
  readonly isSurveyed?: boolean;
}

const JR_PLANS: readonly DemoPilePlan[] = [
  { name: 'jr-east-mill-dump', material: 'mill-discharge', shapeModel: 'flat-topped', bearingDeg: 80, distanceM: 420, acrossM: 38, heightM: 3.2, angleOfReposeDeg: 34, moisturePct: 11, hazards: ['mercury', 'silica-dust'], notes: 'Ball-mill discharge from the old east shed; owner Mzee Kiboko asks a share per tonne hauled.', medianGpt: 4.6, logSpread: 0.45, routineSamples: 9 },
  { name: 'jr-river-sluice-a', material: 'sluice-tailings', shapeModel: 'cone', bearingDeg: 155, distanceM: 780, acrossM: 24, heightM: 2.1, angleOfReposeDeg: 33, moisturePct: 14, hazards: ['deep-water'], notes: 'Sluice sand beside the seasonal stream; worked by the river crew.', medianGpt: 1.9, logSpread: 0.5, routineSamples: 6 },
  { name: 'jr-river-sluice-b', material: 'sluice-tailings', shapeModel: 'flat-topped', bearingDeg: 170, distanceM: 1150, acrossM: 52, heightM: 2.4, angleOfReposeDeg: 32, moisturePct: 12, hazards: ['mercury'], notes: 'Long flat dump downstream of the old amalgamation pans.', medianGpt: 1.2, logSpread: 0.55, routineSamples: 8 },
  { name: 'jr-ridge-waste', material: 'waste-rock', shapeModel: 'cone', bearingDeg: 300, distanceM: 1650, acrossM: 30, heightM: 3.8, angleOfReposeDeg: 37, moisturePct: 4, hazards: ['unstable-face'], notes: 'Hand-picked waste from the ridge shafts; loose blocks on the north face.', medianGpt: 0.35, logSpread: 0.4, routineSamples: 4 },
  { name: 'jr-shed-sacks', material: 'mill-discharge', shapeModel: 'sacks', bearingDeg: 20, distanceM: 260, acrossM: 16, heightM: 1.2, angleOfReposeDeg: null, moisturePct: 9, hazards: ['silica-dust'], notes: 'Sacked fine discharge stacked behind the shed, kept by the shed owner.', medianGpt: 2.8, logSpread: 0.35, routineSamples: 4, sacks: { count: 340, massKg: 42 } },
  { name: 'jr-north-pit-spoil', material: 'pit-spoil', shapeModel: 'surveyed', bearingDeg: 345, distanceM: 1900, acrossM: 44, heightM: null, angleOfReposeDeg: 33, moisturePct: 13, hazards: ['unstable-face', 'traffic'], notes: 'Spoil heaped around the north pit collar; the haul track crosses its west toe.', medianGpt: 0.8, logSpread: 0.5, routineSamples: 5, isSurveyed: true },
];

const IF_PLANS: readonly DemoPilePlan[] = [
  { name: 'if-flats-sluice', material: 'sluice-tailings', shapeModel: 'flat-topped', bearingDeg: 60, distanceM: 640, acrossM: 46, heightM: 1.8, angleOfReposeDeg: 31, moisturePct: 15, hazards: ['mercury', 'deep-water'], notes: 'Sluice tailings on the flats by the old pond.', medianGpt: 1.3, logSpread: 0.45, routineSamples: 6 },
  { name: 'if-south-pit-spoil', material: 'pit-spoil', shapeModel: 'cone', bearingDeg: 200, distanceM: 1400, acrossM: 28, heightM: 2.6, angleOfReposeDeg: 33, moisturePct: 12, hazards: ['unstable-face'], notes: 'Spoil beside the south pit; little visible quartz.', medianGpt: 0.3, logSpread: 0.4, routineSamples: 4 },
  { name: 'if-ironstone-mill', material: 'mill-discharge', shapeModel: 'flat-topped', bearingDeg: 120, distanceM: 350, acrossM: 34, heightM: 2.9, angleOfReposeDeg: 35, moisturePct: 10, hazards: ['mercury', 'silica-dust'], notes: 'Discharge of the ironstone mill, fine and grey.', medianGpt: 2.2, logSpread: 0.4, routineSamples: 7 },
  { name: 'if-west-waste', material: 'waste-rock', shapeModel: 'cone', bearingDeg: 265, distanceM: 900, acrossM: 20, heightM: 1.6, angleOfReposeDeg: 36, moisturePct: 5, hazards: [], notes: 'Small heap of hand-picked waste rock.', medianGpt: 0.6, logSpread: 0.35, routineSamples: 4 },
];

/** The demo's two devices: the sampler's phone at Jackal Ridge and the geologist's tablet at Ironstone Flats. */
export const DEMO_DEVICES = { sampler: 'demo-phone-jr-01', geologist: 'demo-tablet-if-01' } as const;

/** The invented reference standard the demo inserts at Jackal Ridge (its code, not a real product). */
export const DEMO_STANDARD_ID = 'JRM-STD-2.5';

/** Metres per degree of latitude (mean, WGS84): close enough to lay out invented piles. */
const METRES_PER_DEGREE = 111_320;

/** A UUID (version 5 layout) from a name in the demo's namespace: the same name gives the same id every time. */
export function demoUuid(name: string): string {
  const hash = createHash('sha1').update(`${DEMO_ORGANIZATION.id}/capture/${name}`).digest();
  hash[6] = (hash[6] & 0x0f) | 0x50;
  hash[8] = (hash[8] & 0x3f) | 0x80;
  const hex = hash.subarray(0, 16).toString('hex');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20, 32)}`;
}

/** Everything the demo pushes for one site, in push order (piles, then samples, then pan tests). */
export interface DemoCapture {
  readonly piles: PileData[];
  readonly samples: SampleData[];
  readonly panTests: PanTestData[];
}

/** Builds the demo piles, samples and pan tests of one site (pure: the same inputs give the same records). */
export function buildDemoCapture(options: {
  readonly site: (typeof DEMO_SITES)[number];
  readonly plans: readonly DemoPilePlan[];
  readonly deviceId: string;
  readonly deviceNumber: number;
  readonly collectorId: string;
  readonly withQualityControl: boolean;
  /** The day the demo is seeded; samples fall in the three weeks before it. */
  readonly today: Date;
}): DemoCapture {
  const { site, plans, deviceId, deviceNumber, collectorId, withQualityControl, today } = options;
  const random = seededRandom(hashSeed(site.code));
  const piles: PileData[] = [];
  const samples: SampleData[] = [];
  const panTests: PanTestData[] = [];
  let sampleSequence = 0;
  const code = (kind: 'pile' | 'sample', sequence: number) => makeHumanCode({ siteCode: site.code, deviceNumber, sequence, kind });
  const dayStart = Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate());

  plans.forEach((plan, pileIndex) => {
    const centre = offset([site.processingLon, site.processingLat], plan.bearingDeg, plan.distanceM);
    const ring = walkedRing(centre, plan.acrossM / 2, random);
    const pile: PileData = {
      id: demoUuid(`pile/${plan.name}`), siteId: site.id, code: code('pile', pileIndex + 1), material: plan.material,
      footprint: { type: 'Polygon', coordinates: [ring] }, heightM: plan.heightM, shapeModel: plan.shapeModel,
      angleOfReposeDeg: plan.angleOfReposeDeg, bulkDensityTPerM3: null, moisturePct: plan.moisturePct,
      spotHeights: plan.isSurveyed ? spotHeightsOver(centre, plan.acrossM / 2) : null,
      sackCount: plan.sacks?.count ?? null, sackMassKg: plan.sacks?.massKg ?? null, hazards: [...plan.hazards], notes: plan.notes,
    };
    piles.push(pile);

    // Each pile was walked on one day in the last three weeks; its samples were taken that morning.
    const daysAgo = 20 - Math.round((pileIndex * 19) / Math.max(1, plans.length - 1));
    const walkedAt = dayStart - daysAgo * 86_400_000 + 7.5 * 3_600_000;
    const pileSamples: SampleData[] = [];
    const addSample = (kind: SampleData['sampleType'], extra: Partial<SampleData>, gradeGpt: number | null) => {
      sampleSequence += 1;
      const index = pileSamples.length;
      const collectedAt = new Date(walkedAt + index * 25 * 60_000);
      const point = offset(centre, (index * 137) % 360, (plan.acrossM / 2) * 0.5 * random());
      const sample: SampleData = {
        id: demoUuid(`sample/${plan.name}/${index + 1}`), pileId: pile.id, code: code('sample', sampleSequence), sampleType: kind,
        duplicateOfId: null, standardId: null, location: { type: 'Point', coordinates: point }, gpsAccuracyM: round(3 + 5 * random(), 1),
        wetMassKg: kind === 'standard' ? 0.05 : round(kind === 'blank' ? 2 : 9 + 6 * random(), 1), moisturePct: round(plan.moisturePct + 3 * (random() - 0.5), 1),
        increments: kind === 'routine' || kind === 'duplicate' ? 8 + Math.floor(random() * 5) : 1,
        position: POSITIONS[index % POSITIONS.length], collectedAt: collectedAt.toISOString(), collectorId, deviceId, ...extra,
      };
      samples.push(sample);
      pileSamples.push(sample);
      if (gradeGpt !== null) {
        panTests.push(panTestFor(sample, gradeGpt, index, new Date(collectedAt.getTime() + 5 * 3_600_000), random));
      }
      return sample;
    };

    const grades: number[] = [];
    for (let index = 0; index < plan.routineSamples; index += 1) {
      const gradeGpt = Math.min(6, Math.max(0.3, plan.medianGpt * Math.exp(plan.logSpread * normalQuantile(0.02 + 0.96 * random()))));
      grades.push(gradeGpt);
      addSample('routine', {}, gradeGpt);
    }
    if (withQualityControl && pileIndex < 2) {
      // A field duplicate of the pile's first sample, a blank (barren sand) and the reference standard.
      addSample('duplicate', { duplicateOfId: pileSamples[0].id }, grades[0] * (1 + 0.2 * (random() - 0.5)));
      addSample('blank', { position: 'barren river sand, camp store' }, null);
      addSample('standard', { standardId: DEMO_STANDARD_ID, position: 'reference standard sachet' }, null);
    }
  });
  return { piles, samples, panTests };
}

const POSITIONS = ['toe, 0.3 m', 'mid-slope, 0.5 m', 'crest, 0.4 m', 'toe, 0.6 m', 'mid-slope, 1.0 m', 'crest, 0.2 m'] as const;

/** Gold of a pan test that reads `gradeGpt`: weighed on every third sample, otherwise counted as colours. */
function panTestFor(sample: SampleData, gradeGpt: number, index: number, testedAt: Date, random: () => number): PanTestData {
  const massPannedKg = round(Math.min(8, (sample.wetMassKg ?? 10) * 0.6), 2);
  const panEfficiency = 0.8;
  const goldMg = gradeGpt * massPannedKg * (1 - (sample.moisturePct ?? 0) / 100) * panEfficiency;
  const base = { id: demoUuid(`pan-test/${sample.id}`), sampleId: sample.id, massPannedKg, panEfficiency, testedAt: testedAt.toISOString() };
  if (index % 3 === 2) {
    return { ...base, colours: [], goldMassMg: round(goldMg, 2) };
  }
  // Most of the gold in fine and medium colours, as in crude-washed tailings; a coarse one now and then.
  const shares = [
    { sizeClass: 'coarse' as const, share: random() < 0.3 ? 0.25 : 0 },
    { sizeClass: 'medium' as const, share: 0.4 },
    { sizeClass: 'fine' as const, share: 0.35 },
    { sizeClass: 'very-fine' as const, share: 0.1 },
  ];
  const total = shares.reduce((sum, part) => sum + part.share, 0);
  const colours = shares
    .map(({ sizeClass, share }) => ({ sizeClass, count: Math.round((goldMg * share) / total / colourMassMg(nominalDiameterUm(sizeClass), 7)) }))
    .filter((colour) => colour.count > 0);
  return { ...base, colours: colours.length > 0 ? colours : [{ sizeClass: 'fine', count: 1 }], goldMassMg: null };
}

/** A walked toe: seven corners round the centre at a little over or under the radius, closed. */
function walkedRing(centre: [number, number], radiusM: number, random: () => number): [number, number][] {
  const corners: [number, number][] = [];
  const start = random() * 50;
  for (let corner = 0; corner < 7; corner += 1) {
    corners.push(offset(centre, start + corner * (360 / 7), radiusM * (0.85 + 0.25 * random())));
  }
  return [...corners, corners[0]];
}

/** Spot heights of a surveyed heap: the crest near the middle and two shoulders, inside the toe. */
function spotHeightsOver(centre: [number, number], radiusM: number): NonNullable<PileData['spotHeights']> {
  const spots: [number, number, number][] = [[0, 0, 3.4], [45, 0.4, 2.2], [160, 0.45, 1.9], [280, 0.4, 2.5], [0, 0, 0]];
  return spots.slice(0, 4).map(([bearing, fraction, heightM]) => {
    const [lon, lat] = offset(centre, bearing, radiusM * fraction);
    return { lon, lat, heightM };
  });
}

/** The point `distanceM` from `from` along `bearingDeg`, on a flat local plane (fine over a few km). */
function offset([lon, lat]: readonly [number, number], bearingDeg: number, distanceM: number): [number, number] {
  const bearing = (bearingDeg * Math.PI) / 180;
  const north = distanceM * Math.cos(bearing);
  const east = distanceM * Math.sin(bearing);
  const latitude = lat + north / METRES_PER_DEGREE;
  const longitude = lon + east / (METRES_PER_DEGREE * Math.cos((lat * Math.PI) / 180));
  return [round(longitude, 7), round(latitude, 7)];
}

function round(value: number, digits: number): number {
  const scale = 10 ** digits;
  return Math.round(value * scale) / scale;
}

function hashSeed(text: string): number {
  return createHash('sha1').update(text).digest().readUInt32BE(0);
}

/** The demo person with an id, as the sync service sees a signed-in user. */
function demoUser(role: 'sampler' | 'geologist', deviceId: string): CurrentUser {
  const person = DEMO_PEOPLE.find((candidate) => candidate.role === role);
  if (!person) {
    throw new Error(`the demo scenario has no ${role}`);
  }
  const siteIds: string[] = DEMO_SITES.filter((site) => person.siteCodes.includes(site.code)).map((site) => site.id);
  return { id: person.id, organizationId: DEMO_ORGANIZATION.id, email: person.email, name: person.name, role: person.role, labName: person.labName, siteIds, deviceId };
}

/** Mutations for a capture, parents first, each with an id derived from the record so a replay is a duplicate. */
function mutationsOf(capture: DemoCapture): Mutation[] {
  const mutation = (entity: Mutation['entity'], data: { id: string }): Mutation => ({
    mutationId: demoUuid(`mutation/${entity}/${data.id}`), entity, id: data.id, op: 'upsert', baseRevision: null, data,
  });
  return [
    ...capture.piles.map((pile) => mutation('pile', pile)),
    ...capture.samples.map((sample) => mutation('sample', sample)),
    ...capture.panTests.map((panTest) => mutation('panTest', panTest)),
  ];
}

/**
 * Pushes the demo field work through the sync service: Jackal Ridge as the sampler's phone
 * (with a field duplicate, a blank and a standard), Ironstone Flats as the geologist's tablet
 * (the sampler is not a member there). Seeding again changes nothing.
 */
export async function seedDemoCapture(database: Database, today: Date = new Date()): Promise<{ applied: number }> {
  const sync = new SyncService(database);
  const [jr, ironstone] = [DEMO_SITES[0], DEMO_SITES[1]];
  const sampler = demoUser('sampler', DEMO_DEVICES.sampler);
  const geologist = demoUser('geologist', DEMO_DEVICES.geologist);
  let applied = 0;
  for (const { user, site, plans, withQualityControl } of [
    { user: sampler, site: jr, plans: JR_PLANS, withQualityControl: true },
    { user: geologist, site: ironstone, plans: IF_PLANS, withQualityControl: false },
  ]) {
    const deviceId = user.deviceId as string;
    const { deviceNumber } = await sync.registerDevice(user, deviceId);
    const capture = buildDemoCapture({ site, plans, deviceId, deviceNumber, collectorId: user.id, withQualityControl, today });
    const { results } = await sync.push(user, { deviceId, mutations: mutationsOf(capture) });
    const refused = results.filter((result) => result.status === 'rejected' || result.status === 'conflict');
    if (refused.length > 0) {
      throw new Error(`the demo capture at ${site.code} was refused: ${JSON.stringify(refused.slice(0, 3))}`);
    }
    applied += results.filter((result) => result.status === 'applied').length;
  }
  return { applied };
}
