import type { Role } from '../../../shared/accounts/roles';
import type { MatrixContext } from './matrix-context';

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
];
