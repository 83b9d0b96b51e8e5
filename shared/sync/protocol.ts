/**
 * The sync protocol between a device and the server (DESIGN §5), as wire types and zod schemas.
 *
 * Assumptions, in the order the rest of the code leans on them:
 * - Every record is born on a device with a UUID; the server never renames an id.
 * - A device queues its changes as mutations `{mutationId, entity, id, op, baseRevision, data}`.
 *   `mutationId` is a UUID made when the change was queued; a mutation may be sent any number of
 *   times (a lost answer, a killed app) and the server applies it at most once.
 * - `baseRevision` is the server revision the device last saw for the record (`null` for a record
 *   the server has never seen). The server applies a change only on top of that revision; otherwise
 *   it keeps both versions as a conflict for a geologist to resolve. Nothing is silently overwritten.
 * - `data` is the whole record in the API's field names (DESIGN §6), never a patch.
 * - Deletes are soft: the record stays with `deletedAt` set, so a delete travels like any change.
 * - The server stamps every change with one server-wide, monotonic integer revision. A pull asks for
 *   the changes after a cursor (the last revision seen) in revision order; a record changed again
 *   while a device is paging moves past the cursor and arrives on a later page, never skipped. One
 *   integer needs no tie-breaking between changes made in the same millisecond.
 * - A push batch is applied in one transaction; each mutation gets its own answer (applied,
 *   duplicate, conflict, rejected), so one bad record never holds back the rest.
 */
import { z } from 'zod';
import { parseFootprint } from '../engine/footprint';
import { HAZARDS } from '../safety/cautions';

/** The record kinds that sync. */
export const SYNC_ENTITIES = ['pile', 'sample', 'panTest', 'photo'] as const;
/** One record kind that syncs. */
export type SyncEntity = (typeof SYNC_ENTITIES)[number];

/** What a mutation does to its record. */
export const MUTATION_OPS = ['upsert', 'delete'] as const;
/** What a mutation does to its record. */
export type MutationOp = (typeof MUTATION_OPS)[number];

/** The server's answer to one mutation. */
export type MutationStatus = 'applied' | 'duplicate' | 'conflict' | 'rejected';

/** Largest batch the server takes in one push; a device sends this many or fewer. */
export const MAX_PUSH_BATCH = 500;
/** Largest page a pull returns. */
export const MAX_PULL_LIMIT = 1000;

/** Kinds of material in a pile (the shared engine's material defaults use the same words). */
export const PILE_MATERIALS = ['mill-discharge', 'sluice-tailings', 'waste-rock', 'pit-spoil'] as const;
/** How a pile's volume is modelled (DESIGN §6 `shapeModel`). */
export const SHAPE_MODELS = ['cone', 'flat-topped', 'surveyed', 'sacks'] as const;
/** Sample types for QA/QC (DESIGN §6 `sampleType`). */
export const SAMPLE_TYPES = ['routine', 'duplicate', 'blank', 'standard'] as const;
/** Colour size classes of a pan test, bounded by ASTM E11 sieves (same words as the shared engine). */
export const COLOUR_SIZE_CLASSES = ['very-coarse', 'coarse', 'medium', 'fine', 'very-fine'] as const;
/** Photo types the server stores (the device re-encodes camera pictures as JPEG). */
export const PHOTO_CONTENT_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

const uuid = z.uuid();
const longitude = z.number().min(-180).max(180);
const latitude = z.number().min(-90).max(90);
const position = z.tuple([longitude, latitude]);
const isoDateTime = z.iso.datetime({ offset: true });

/** A GeoJSON Point in WGS84 lon/lat. */
export const pointSchema = z.object({ type: z.literal('Point'), coordinates: position }).strict();

/**
 * A GeoJSON Polygon in WGS84 lon/lat: one closed outer ring of at least three distinct corners
 * (holes are not used for piles). The engine's footprint check runs here too, so a ring that
 * crosses itself or encloses no area is refused at the edge, before it is stored and every volume
 * estimate of the pile fails later. Either winding is taken (RFC 7946 §3.1.6 asks readers not to refuse).
 */
export const polygonSchema = z
  .object({ type: z.literal('Polygon'), coordinates: z.array(z.array(position).min(4)).length(1) })
  .strict()
  .refine((polygon) => {
    const ring = polygon.coordinates[0];
    const first = ring[0];
    const last = ring[ring.length - 1];
    return first[0] === last[0] && first[1] === last[1];
  }, 'The footprint ring must end where it starts')
  .superRefine((polygon, context) => {
    const parsed = parseFootprint(polygon);
    if (!parsed.ok) {
      parsed.errors.forEach((error) => context.addIssue({ code: 'custom', path: ['coordinates'], message: error.message }));
    }
  });

/** A human code `SITE-DEVICE-SEQ` (samples) or `SITE-DEVICE-PSEQ` (piles), e.g. `JR-07-0042`. */
const humanCode = z.string().regex(/^[A-Z0-9]{1,8}-\d{2,4}-P?\d{4,6}$/, 'A code looks like JR-07-0042');

/** A pile as the API names it (DESIGN §6). */
export const pileSchema = z
  .object({
    id: uuid,
    siteId: uuid,
    code: humanCode,
    material: z.enum(PILE_MATERIALS),
    footprint: polygonSchema.nullable(),
    heightM: z.number().positive().max(100).nullable(),
    shapeModel: z.enum(SHAPE_MODELS),
    angleOfReposeDeg: z.number().min(10).max(60).nullable(),
    bulkDensityTPerM3: z.number().min(0.5).max(4).nullable(),
    moisturePct: z.number().min(0).max(99).nullable(),
    spotHeights: z.array(z.object({ lon: longitude, lat: latitude, heightM: z.number().min(0).max(100) }).strict()).max(500).nullable(),
    sackCount: z.number().int().min(0).max(100_000).nullable(),
    sackMassKg: z.number().positive().max(200).nullable(),
    hazards: z.array(z.enum(HAZARDS)).max(HAZARDS.length),
    notes: z.string().max(4000),
  })
  .strict()
  .superRefine((pile, context) => {
    if (pile.shapeModel === 'sacks' && (pile.sackCount === null || pile.sackMassKg === null)) {
      context.addIssue({ code: 'custom', path: ['sackCount'], message: 'A pile of sacks needs the sack count and mass per sack' });
    }
    if ((pile.shapeModel === 'cone' || pile.shapeModel === 'flat-topped') && pile.heightM === null) {
      context.addIssue({ code: 'custom', path: ['heightM'], message: 'A cone or flat-topped pile needs its height' });
    }
  });

/** A sample as the API names it (DESIGN §6). */
export const sampleSchema = z
  .object({
    id: uuid,
    pileId: uuid,
    code: humanCode,
    sampleType: z.enum(SAMPLE_TYPES),
    duplicateOfId: uuid.nullable(),
    standardId: z.string().min(1).max(64).nullable(),
    location: pointSchema.nullable(),
    gpsAccuracyM: z.number().min(0).max(10_000).nullable(),
    wetMassKg: z.number().positive().max(1000).nullable(),
    moisturePct: z.number().min(0).max(99).nullable(),
    increments: z.number().int().min(1).max(1000),
    /** Depth or position on the pile in words or metres, e.g. "toe, 0.3 m". */
    position: z.string().max(200),
    collectedAt: isoDateTime,
    collectorId: uuid,
    deviceId: z.string().min(1).max(64),
  })
  .strict()
  .superRefine((sample, context) => {
    if (sample.sampleType === 'duplicate' && sample.duplicateOfId === null) {
      context.addIssue({ code: 'custom', path: ['duplicateOfId'], message: 'A field duplicate names the sample it duplicates' });
    }
    if (sample.sampleType === 'standard' && sample.standardId === null) {
      context.addIssue({ code: 'custom', path: ['standardId'], message: 'A reference standard names which standard it is' });
    }
  });

/** A pan test as the API names it (DESIGN §6); either colours or weighed gold. */
export const panTestSchema = z
  .object({
    id: uuid,
    sampleId: uuid,
    massPannedKg: z.number().positive().max(100),
    colours: z.array(z.object({ sizeClass: z.enum(COLOUR_SIZE_CLASSES), count: z.number().int().min(0).max(100_000) }).strict()).max(COLOUR_SIZE_CLASSES.length),
    goldMassMg: z.number().min(0).max(1_000_000).nullable(),
    panEfficiency: z.number().gt(0).max(1).nullable(),
    testedAt: isoDateTime,
  })
  .strict()
  .refine((panTest) => new Set(panTest.colours.map((colour) => colour.sizeClass)).size === panTest.colours.length, {
    path: ['colours'],
    message: 'Each size class appears once',
  });

/** The record of one photo; its bytes go up separately with `PUT /api/photos/:uuid`. */
export const photoSchema = z
  .object({
    id: uuid,
    ownerEntity: z.enum(['pile', 'sample']),
    ownerId: uuid,
    contentType: z.enum(PHOTO_CONTENT_TYPES),
    originalWidth: z.number().int().positive().max(20_000),
    originalHeight: z.number().int().positive().max(20_000),
    byteSize: z.number().int().positive(),
    takenAt: isoDateTime,
  })
  .strict();

/** A pile record as sent and stored. */
export type PileData = z.infer<typeof pileSchema>;
/** A sample record as sent and stored. */
export type SampleData = z.infer<typeof sampleSchema>;
/** A pan-test record as sent and stored. */
export type PanTestData = z.infer<typeof panTestSchema>;
/** A photo record as sent and stored. */
export type PhotoData = z.infer<typeof photoSchema>;

/** The data shape of each entity. */
export interface EntityData {
  pile: PileData;
  sample: SampleData;
  panTest: PanTestData;
  photo: PhotoData;
}

/** The schema of each entity's `data`. */
export const ENTITY_SCHEMAS = {
  pile: pileSchema,
  sample: sampleSchema,
  panTest: panTestSchema,
  photo: photoSchema,
} as const satisfies Record<SyncEntity, z.ZodType>;

/**
 * One mutation on the wire. `data` is checked against its entity's schema separately, so a bad
 * record is rejected on its own with its reasons rather than failing the whole batch.
 */
export const mutationSchema = z
  .object({
    mutationId: uuid,
    entity: z.enum(SYNC_ENTITIES),
    id: uuid,
    op: z.enum(MUTATION_OPS),
    baseRevision: z.number().int().min(0).nullable(),
    data: z.unknown(),
  })
  .strict();

/** One mutation as a device sends it. */
export interface Mutation {
  readonly mutationId: string;
  readonly entity: SyncEntity;
  readonly id: string;
  readonly op: MutationOp;
  readonly baseRevision: number | null;
  readonly data: unknown;
}

/** `POST /api/sync/push` body. */
export const pushRequestSchema = z
  .object({
    deviceId: z.string().min(1).max(64),
    mutations: z.array(mutationSchema).min(1).max(MAX_PUSH_BATCH),
  })
  .strict();

/** `POST /api/sync/push` body. */
export interface PushRequest {
  readonly deviceId: string;
  readonly mutations: readonly Mutation[];
}

/** One reason a mutation was refused: where, and what is wrong. */
export interface FieldError {
  readonly path: string;
  readonly message: string;
}

/** The server's answer to one mutation. `revision` is the record's revision after it (or the server's, on conflict). */
export interface MutationResult {
  readonly mutationId: string;
  readonly status: MutationStatus;
  readonly revision: number | null;
  readonly errors: readonly FieldError[];
  /** On conflict: the conflict to resolve in `Sync`. */
  readonly conflictId?: string;
}

/** `POST /api/sync/push` answer, one result per mutation in the order sent. */
export interface PushResponse {
  readonly results: readonly MutationResult[];
}

/** `GET /api/sync/pull` query. */
export const pullQuerySchema = z
  .object({
    since: z.coerce.number().int().min(0).default(0),
    limit: z.coerce.number().int().min(1).max(MAX_PULL_LIMIT).default(200),
  })
  .strict();

/** One changed record in a pull: its latest state, deleted or not. */
export interface PulledChange {
  readonly entity: SyncEntity;
  readonly id: string;
  readonly revision: number;
  readonly siteId: string;
  readonly deletedAt: string | null;
  readonly data: EntityData[SyncEntity];
}

/** `GET /api/sync/pull` answer. `cursor` is the `since` of the next page. */
export interface PullResponse {
  readonly changes: readonly PulledChange[];
  readonly cursor: number;
  readonly hasMore: boolean;
}

/** How a geologist settles a conflict: keep the server's version, take the device's, or write a merged record. */
export const resolveConflictSchema = z.discriminatedUnion('choice', [
  z.object({ choice: z.literal('server') }).strict(),
  z.object({ choice: z.literal('device') }).strict(),
  z.object({ choice: z.literal('merged'), data: z.record(z.string(), z.unknown()) }).strict(),
]);

/** `POST /api/sync/conflicts/:id/resolve` body. */
export type ResolveConflictRequest = z.infer<typeof resolveConflictSchema>;

/** A conflict as `GET /api/sync/conflicts` lists it. */
export interface ConflictView {
  readonly id: string;
  readonly entity: SyncEntity;
  readonly recordId: string;
  readonly siteId: string;
  readonly deviceId: string;
  readonly baseRevision: number | null;
  readonly serverRevision: number;
  readonly deviceOp: MutationOp;
  readonly deviceData: unknown;
  readonly serverData: unknown;
  readonly status: 'open' | 'resolved';
  readonly createdAt: string;
}

/** `POST /api/sync/device` answer: the short number this device puts in its codes. */
export interface DeviceRegistration {
  readonly deviceId: string;
  readonly deviceNumber: number;
}

/** Checks `data` against its entity's schema. */
export function parseEntityData<E extends SyncEntity>(
  entity: E,
  data: unknown,
): { ok: true; data: EntityData[E] } | { ok: false; errors: FieldError[] } {
  const result = ENTITY_SCHEMAS[entity].safeParse(data);
  if (result.success) {
    return { ok: true, data: result.data as EntityData[E] };
  }
  return { ok: false, errors: result.error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message })) };
}
