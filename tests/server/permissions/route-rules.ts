import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type { Role } from '../../../shared/accounts/roles';
import type { MatrixContext } from './matrix-context';
import { LAB_ROUTE_RULES } from '../lab/support/lab-route-rules';
import { CAMP_BOX, makePng, squareFootprint, uploadSiteImage } from '../review/support/review-fixtures';

/**
 * THE ROLE × ROUTE TABLE. Every route the app serves under /api has exactly one rule here, and
 * role-route-matrix.test.ts calls each route as every role, as a stranger, and (when given) out
 * of the role's scope. A route added without a rule fails the test; so does a rule whose route
 * is gone.
 *
 * To add a route: append one entry, in the section of your component, with
 *   - `route`: the method and the full path exactly as Express has it, e.g. 'GET /api/piles/:id';
 *   - `allowed`: the roles that may call it ('public' when no sign-in is needed);
 *   - `request`: builds a request that a permitted caller makes successfully (2xx). It gets the
 *     context (demo people and sites, tokens, helpers, the database to make records) and the role
 *     calling, so it can make a fresh record per call;
 *   - `outOfScope` (optional): the same route aimed at something the caller may not reach (a site
 *     they are not a member of, another lab's batch). Allowed roles not listed in `reachesOutOfScope`
 *     (default: admin only) must get 403 or 404.
 * Denied roles must get 403 and strangers 401 (public routes: 2xx for strangers).
 */
export interface RequestSpec {
  /** The URL with ids and query filled in. */
  readonly url: string;
  readonly body?: unknown;
}

/** Who may call a route. */
export type Access = 'public' | readonly Role[];

export interface RouteRule {
  readonly route: string;
  readonly allowed: Access;
  readonly request: (context: MatrixContext, role: Role | null) => RequestSpec | Promise<RequestSpec>;
  readonly outOfScope?: (context: MatrixContext, role: Role) => RequestSpec | Promise<RequestSpec>;
  readonly reachesOutOfScope?: readonly Role[];
}

const EVERYONE: readonly Role[] = ['sampler', 'geologist', 'lab', 'manager', 'admin'];
const SITE_READERS: readonly Role[] = ['sampler', 'geologist', 'manager', 'admin'];
const ADMIN: readonly Role[] = ['admin'];

// ── capture and sync: helpers that make fresh field records through the API ─────────────────
const CAPTURE: readonly Role[] = ['sampler', 'geologist'];
const GEOLOGIST: readonly Role[] = ['geologist'];
const FIXTURE_PHOTO = readFileSync(join(__dirname, '../../fixtures/pile-photo.jpg'));

async function pushAs(context: MatrixContext, role: Role, mutations: readonly Record<string, unknown>[], deviceId = 'matrix-device') {
  const response = await request(context.app).post('/api/sync/push').set('Authorization', `Bearer ${context.tokens[role]}`).send({ deviceId, mutations });
  return response.body.results as { status: string; revision: number; conflictId?: string }[];
}

function matrixPile(context: MatrixContext, siteId: string, siteCode: string) {
  return {
    id: randomUUID(), siteId, code: `${siteCode}-99-P${String(Math.floor(Math.random() * 1e6)).padStart(6, '0')}`, material: 'waste-rock',
    footprint: null, heightM: 2, shapeModel: 'cone', angleOfReposeDeg: 35, bulkDensityTPerM3: null, moisturePct: 5,
    spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: `matrix ${context.unique()}`,
  };
}

/** A new pile at JR owned by the role (geologist when the role may not capture). */
async function newPile(context: MatrixContext, role: Role | null, siteCode: 'JR' | 'IF' = 'JR') {
  const owner: Role = role === 'sampler' && siteCode === 'JR' ? 'sampler' : 'geologist';
  const pile = matrixPile(context, context.sites[siteCode], siteCode);
  const [result] = await pushAs(context, owner, [{ mutationId: randomUUID(), entity: 'pile', id: pile.id, op: 'upsert', baseRevision: null, data: pile }]);
  return { pile, revision: result.revision };
}

async function newConflictId(context: MatrixContext) {
  const { pile, revision } = await newPile(context, 'geologist');
  const edit = (notes: string) => ({ mutationId: randomUUID(), entity: 'pile', id: pile.id, op: 'upsert', baseRevision: revision, data: { ...pile, notes } });
  await pushAs(context, 'geologist', [edit('first')], 'matrix-a');
  const [conflict] = await pushAs(context, 'geologist', [edit('second')], 'matrix-b');
  return conflict.conflictId as string;
}

/** A photo of a new pile, record synced and picture stored. */
async function newStoredPhotoId(context: MatrixContext, siteCode: 'JR' | 'IF' = 'JR', role: Role | null = 'geologist') {
  const owner: Role = role === 'sampler' && siteCode === 'JR' ? 'sampler' : 'geologist';
  const { pile } = await newPile(context, owner, siteCode);
  const photo = { id: randomUUID(), ownerEntity: 'pile', ownerId: pile.id, contentType: 'image/jpeg', originalWidth: 640, originalHeight: 480, byteSize: FIXTURE_PHOTO.length, takenAt: new Date().toISOString() };
  await pushAs(context, owner, [{ mutationId: randomUUID(), entity: 'photo', id: photo.id, op: 'upsert', baseRevision: null, data: photo }]);
  await request(context.app).put(`/api/photos/${photo.id}`).set('Authorization', `Bearer ${context.tokens[owner]}`)
    .attach('photo', FIXTURE_PHOTO, { filename: 'pile.jpg', contentType: 'image/jpeg' });
  return photo.id;
}

// ── review desk: a pile with a footprint (so it can be estimated) and a stored site image ────
async function newEstimablePileId(context: MatrixContext, siteCode: 'JR' | 'IF' = 'JR') {
  const pile = { ...matrixPile(context, context.sites[siteCode], siteCode), footprint: squareFootprint(33.4518, -4.0512, 10) };
  await pushAs(context, 'geologist', [{ mutationId: randomUUID(), entity: 'pile', id: pile.id, op: 'upsert', baseRevision: null, data: pile }]);
  return pile.id;
}

/** Makes sure the site has an image (uploaded by the demo admin) and answers the site id. */
async function siteWithImage(context: MatrixContext, siteId: string) {
  await uploadSiteImage(context.app, context.tokens.admin, siteId, await makePng());
  return siteId;
}

// ── trials, economics and the shortlist: helpers ───────────────────────────────────────────
const SHORTLIST_READERS: readonly Role[] = ['geologist', 'manager', 'admin'];
const TRIAL_KEEPERS: readonly Role[] = ['geologist', 'manager'];

/** A valid trial over a new JR pile (two-product grades with c > f > t). */
async function matrixTrial(context: MatrixContext) {
  const { pile } = await newPile(context, 'geologist');
  return {
    siteId: context.sites.JR, pileIds: [pile.id], trialDate: '2025-05-10', equipmentNote: 'matrix', feedMassKg: 100, feedGradeGpt: 2,
    concentrateMassKg: 1, concentrateGradeGpt: 150, tailingsGradeGpt: 0.6,
  };
}

async function newTrialId(context: MatrixContext): Promise<string> {
  const response = await request(context.app).post('/api/trials').set('Authorization', `Bearer ${context.tokens.manager}`).send(await matrixTrial(context));
  return response.body.id as string;
}

export const ROUTE_RULES: readonly RouteRule[] = [
  // ── health and sign-in (public) ──────────────────────────────────────────────────────────
  { route: 'GET /api/health', allowed: 'public', request: () => ({ url: '/api/health' }) },
  {
    route: 'POST /api/auth/login', allowed: 'public',
    request: (context) => ({ url: '/api/auth/login', body: { email: context.people.sampler.email, password: 'heapsight-demo' } }),
  },
  { route: 'POST /api/auth/refresh', allowed: 'public', request: async (context) => ({ url: '/api/auth/refresh', body: { refreshToken: await context.newRefreshToken() } }) },
  { route: 'POST /api/auth/logout', allowed: 'public', request: async (context) => ({ url: '/api/auth/logout', body: { refreshToken: await context.newRefreshToken() } }) },
  { route: 'POST /api/auth/password-reset', allowed: 'public', request: (context) => ({ url: '/api/auth/password-reset', body: { email: context.people.manager.email } }) },
  { route: 'POST /api/auth/link', allowed: 'public', request: async (context) => ({ url: '/api/auth/link', body: { token: await context.newLinkToken() } }) },
  {
    route: 'POST /api/auth/password', allowed: 'public',
    request: async (context) => ({ url: '/api/auth/password', body: { token: await context.newLinkToken(), password: 'a-long-enough-password' } }),
  },

  // ── accounts: the signed-in person ───────────────────────────────────────────────────────
  { route: 'GET /api/me', allowed: EVERYONE, request: () => ({ url: '/api/me' }) },
  { route: 'PATCH /api/me/device', allowed: EVERYONE, request: (_context, role) => ({ url: '/api/me/device', body: { name: `${role} phone` } }) },

  // ── sites ────────────────────────────────────────────────────────────────────────────────
  { route: 'GET /api/sites', allowed: EVERYONE, request: () => ({ url: '/api/sites' }) },
  { route: 'POST /api/sites', allowed: ADMIN, request: (context) => ({ url: '/api/sites', body: { code: `S${context.unique().slice(-7)}`, name: 'New camp' } }) },
  {
    route: 'GET /api/sites/:id', allowed: SITE_READERS,
    request: (context) => ({ url: `/api/sites/${context.sites.JR}` }),
    outOfScope: (context) => ({ url: `/api/sites/${context.sites.outside}` }),
  },
  { route: 'PATCH /api/sites/:id', allowed: ADMIN, request: (context) => ({ url: `/api/sites/${context.sites.outside}`, body: { name: 'Renamed outside site' } }) },

  // ── People & sites (admin) ───────────────────────────────────────────────────────────────
  { route: 'GET /api/people', allowed: ADMIN, request: () => ({ url: '/api/people' }) },
  {
    route: 'POST /api/people/invitations', allowed: ADMIN,
    request: (context) => ({ url: '/api/people/invitations', body: { email: `${context.unique().toLowerCase()}@matrix.test`, name: 'Invited', role: 'sampler', siteIds: [context.sites.JR] } }),
  },
  { route: 'POST /api/people/:id/invitation', allowed: ADMIN, request: async (context) => ({ url: `/api/people/${await context.newInvitedPersonId()}/invitation` }) },
  { route: 'PATCH /api/people/:id', allowed: ADMIN, request: async (context) => ({ url: `/api/people/${await context.newPersonId()}`, body: { role: 'geologist', siteIds: [context.sites.IF] } }) },

  // ── Outbox (admin) ───────────────────────────────────────────────────────────────────────
  { route: 'GET /api/outbox', allowed: ADMIN, request: () => ({ url: '/api/outbox' }) },
  { route: 'GET /api/outbox/:id', allowed: ADMIN, request: async (context) => ({ url: `/api/outbox/${await context.outboxMessageId()}` }) },
  // ── capture and sync ─────────────────────────────────────────────────────────────────────
  {
    route: 'POST /api/sync/push', allowed: CAPTURE,
    request: (context) => {
      const pile = matrixPile(context, context.sites.JR, 'JR');
      return { url: '/api/sync/push', body: { deviceId: 'matrix-device', mutations: [{ mutationId: randomUUID(), entity: 'pile', id: pile.id, op: 'upsert', baseRevision: null, data: pile }] } };
    },
  },
  { route: 'GET /api/sync/pull', allowed: SITE_READERS, request: () => ({ url: '/api/sync/pull?since=0&limit=10' }) },
  { route: 'GET /api/sync/conflicts', allowed: SITE_READERS, request: () => ({ url: '/api/sync/conflicts' }) },
  {
    route: 'POST /api/sync/conflicts/:id/resolve', allowed: GEOLOGIST,
    request: async (context) => ({ url: `/api/sync/conflicts/${await newConflictId(context)}/resolve`, body: { choice: 'server' } }),
  },
  { route: 'POST /api/sync/device', allowed: CAPTURE, request: (context) => ({ url: '/api/sync/device', body: { deviceId: `matrix-${context.unique()}` } }) },
  { route: 'GET /api/piles', allowed: SITE_READERS, request: () => ({ url: '/api/piles' }) },
  {
    route: 'GET /api/piles/:id', allowed: SITE_READERS,
    request: async (context) => ({ url: `/api/piles/${(await newPile(context, 'geologist')).pile.id}` }),
    outOfScope: async (context) => ({ url: `/api/piles/${(await newPile(context, 'geologist', 'IF')).pile.id}` }),
    reachesOutOfScope: ['geologist', 'manager', 'admin'],
  },
  {
    route: 'PATCH /api/piles/:id', allowed: CAPTURE,
    request: async (context, role) => {
      const { pile, revision } = await newPile(context, role);
      return { url: `/api/piles/${pile.id}`, body: { baseRevision: revision, changes: { heightM: 2.5 } } };
    },
  },
  { route: 'GET /api/samples', allowed: SITE_READERS, request: () => ({ url: '/api/samples' }) },
  { route: 'GET /api/photos', allowed: SITE_READERS, request: () => ({ url: '/api/photos' }) },
  {
    route: 'PUT /api/photos/:uuid', allowed: CAPTURE,
    // A photo already stored: the PUT is idempotent and needs no file to answer 200.
    request: async (context, role) => ({ url: `/api/photos/${await newStoredPhotoId(context, 'JR', role)}` }),
  },
  {
    route: 'GET /api/photos/:uuid', allowed: SITE_READERS,
    request: async (context) => ({ url: `/api/photos/${await newStoredPhotoId(context)}?size=full` }),
    outOfScope: async (context) => ({ url: `/api/photos/${await newStoredPhotoId(context, 'IF')}` }),
    reachesOutOfScope: ['geologist', 'manager', 'admin'],
  },
  // ── review desk ──────────────────────────────────────────────────────────────────────────
  { route: 'GET /api/client-config', allowed: 'public', request: () => ({ url: '/api/client-config' }) },
  {
    route: 'GET /api/piles/:id/estimate', allowed: SITE_READERS,
    request: async (context) => ({ url: `/api/piles/${await newEstimablePileId(context)}/estimate` }),
    outOfScope: async (context) => ({ url: `/api/piles/${await newEstimablePileId(context, 'IF')}/estimate` }),
    reachesOutOfScope: ['geologist', 'manager', 'admin'],
  },
  {
    route: 'GET /api/review/sites/:siteId', allowed: SITE_READERS,
    request: (context) => ({ url: `/api/review/sites/${context.sites.JR}` }),
    outOfScope: (context) => ({ url: `/api/review/sites/${context.sites.outside}` }),
  },
  {
    route: 'PUT /api/sites/:id/image', allowed: ADMIN,
    // With an image already stored, a PUT of corners alone moves its box (no file needed).
    request: async (context) => ({ url: `/api/sites/${await siteWithImage(context, context.sites.outside)}/image`, body: CAMP_BOX }),
  },
  {
    route: 'GET /api/sites/:id/image-info', allowed: SITE_READERS,
    request: async (context) => ({ url: `/api/sites/${await siteWithImage(context, context.sites.JR)}/image-info` }),
    outOfScope: async (context) => ({ url: `/api/sites/${await siteWithImage(context, context.sites.outside)}/image-info` }),
  },
  {
    route: 'GET /api/sites/:id/image', allowed: SITE_READERS,
    request: async (context) => ({ url: `/api/sites/${await siteWithImage(context, context.sites.JR)}/image` }),
    outOfScope: async (context) => ({ url: `/api/sites/${await siteWithImage(context, context.sites.outside)}/image` }),
  },
  // ── trials, economics and the shortlist ─────────────────────────────────────────────────
  { route: 'GET /api/trials', allowed: SHORTLIST_READERS, request: (context) => ({ url: `/api/trials?site=${context.sites.JR}` }), outOfScope: (context) => ({ url: `/api/trials?site=${context.sites.outside}` }) },
  { route: 'POST /api/trials', allowed: TRIAL_KEEPERS, request: async (context) => ({ url: '/api/trials', body: await matrixTrial(context) }) },
  {
    route: 'PATCH /api/trials/:id', allowed: TRIAL_KEEPERS,
    request: async (context) => ({ url: `/api/trials/${await newTrialId(context)}`, body: { status: 'pending' } }),
  },
  {
    route: 'GET /api/economics/:siteId', allowed: SHORTLIST_READERS,
    request: (context) => ({ url: `/api/economics/${context.sites.JR}` }), outOfScope: (context) => ({ url: `/api/economics/${context.sites.outside}` }),
  },
  { route: 'PATCH /api/economics/:siteId', allowed: ['manager'], request: (context) => ({ url: `/api/economics/${context.sites.JR}`, body: { fixedCostPerPile: 250 } }) },
  {
    route: 'GET /api/shortlist', allowed: SHORTLIST_READERS,
    request: (context) => ({ url: `/api/shortlist?site=${context.sites.JR}` }), outOfScope: (context) => ({ url: `/api/shortlist?site=${context.sites.outside}` }),
  },
  {
    route: 'GET /api/shortlist/report.pdf', allowed: SHORTLIST_READERS,
    request: (context) => ({ url: `/api/shortlist/report.pdf?site=${context.sites.JR}` }), outOfScope: (context) => ({ url: `/api/shortlist/report.pdf?site=${context.sites.outside}` }),
  },
  {
    route: 'GET /api/shortlist/report.csv', allowed: SHORTLIST_READERS,
    request: (context) => ({ url: `/api/shortlist/report.csv?site=${context.sites.JR}` }), outOfScope: (context) => ({ url: `/api/shortlist/report.csv?site=${context.sites.outside}` }),
  },
  {
    route: 'POST /api/shortlist/report/send', allowed: SHORTLIST_READERS,
    request: (context) => ({ url: '/api/shortlist/report/send', body: { site: context.sites.JR, to: ['matrix@example.test'] } }),
    outOfScope: (context) => ({ url: '/api/shortlist/report/send', body: { site: context.sites.outside, to: ['matrix@example.test'] } }),
  },
  // ── sample labels ────────────────────────────────────────────────────────────────────────
  {
    route: 'GET /api/labels.pdf', allowed: CAPTURE,
    request: (context) => ({ url: `/api/labels.pdf?site=${context.sites.JR}&count=3` }),
    outOfScope: (context) => ({ url: `/api/labels.pdf?site=${context.sites.outside}&count=3` }),
  },
  // ── lab loop: batches, results, QA/QC, calibration, exports (rules in tests/server/lab/support) ──
  ...LAB_ROUTE_RULES,
];
