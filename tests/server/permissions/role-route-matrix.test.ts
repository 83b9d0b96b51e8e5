import request from 'supertest';
import { listRoutes } from '../../../server/accounts/route-table';
import { ROLES, type Role } from '../../../shared/accounts/roles';
import { createTestApp, type TestApp } from '../support/test-app';
import { createMatrixContext, type MatrixContext } from './matrix-context';
import { ROUTE_RULES, type RequestSpec, type RouteRule } from './route-rules';

// bcrypt (about 70 ms a hash) on two shared cores: a full run can take several times longer than alone.
jest.setTimeout(30_000);

/** The role × route matrix: see route-rules.ts for the table and how to add a route. */
let testApp: TestApp;
let context: MatrixContext;

beforeAll(async () => {
  testApp = await createTestApp();
  context = await createMatrixContext(testApp);
});

afterAll(() => testApp.close());

function send(rule: RouteRule, spec: RequestSpec, role: Role | null) {
  const method = rule.route.split(' ')[0]?.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  let call = request(testApp.app)[method](spec.url);
  if (role) {
    call = call.set('Authorization', `Bearer ${context.tokens[role]}`);
  }
  return spec.body === undefined ? call : call.send(spec.body as object);
}

const explain = (response: request.Response) => `${response.status} ${JSON.stringify(response.body)}`;

describe('the role × route table', () => {
  it('has exactly one rule for every API route the app serves, and no rule for a route that is gone', () => {
    const served = listRoutes((testApp.app as unknown as { router: unknown }).router)
      .filter((route) => route.path.startsWith('/api/'))
      .map((route) => `${route.method} ${route.path}`)
      .sort();
    const ruled = ROUTE_RULES.map((rule) => rule.route).sort();
    expect(served.filter((route) => !ruled.includes(route))).toEqual([]);
    expect(ruled.filter((route) => !served.includes(route))).toEqual([]);
    expect(new Set(ruled).size).toBe(ruled.length);
  });
});

describe.each(ROUTE_RULES.map((rule) => [rule.route, rule] as const))('%s', (_route, rule) => {
  if (rule.allowed === 'public') {
    it('answers a stranger (no sign-in needed)', async () => {
      const response = await send(rule, await rule.request(context, null), null);
      expect([response.status, response.status < 300]).toEqual([response.status, true]);
    });
    return;
  }
  const allowed = rule.allowed;

  it('refuses a stranger with 401', async () => {
    const response = await send(rule, await rule.request(context, null), null);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it.each(ROLES.map((role) => [role, allowed.includes(role)] as const))('as %s (allowed: %s)', async (role, isAllowed) => {
    const response = await send(rule, await rule.request(context, role), role);
    if (isAllowed) {
      expect({ ok: response.status < 300, response: explain(response) }).toEqual({ ok: true, response: explain(response) });
    } else {
      expect({ status: response.status, code: response.body?.error?.code }).toEqual({ status: 403, code: 'forbidden' });
    }
  });

  const outOfScope = rule.outOfScope;
  if (outOfScope) {
    const reaches = rule.reachesOutOfScope ?? ['admin'];
    it.each(allowed.map((role) => [role, reaches.includes(role)] as const))('out of scope, as %s (reaches: %s)', async (role, isReached) => {
      const response = await send(rule, await outOfScope(context, role), role);
      if (isReached) {
        expect({ ok: response.status < 300, response: explain(response) }).toEqual({ ok: true, response: explain(response) });
      } else {
        expect([403, 404]).toContain(response.status);
      }
    });
  }
});
