import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import type { Role } from '../../shared/accounts/roles';
import { createTestApp, type TestApp } from '../server/support/test-app';
import { createMatrixContext, type MatrixContext } from '../server/permissions/matrix-context';
import { ROUTE_RULES, type RequestSpec, type RouteRule } from '../server/permissions/route-rules';
import { reportReliabilityFigures } from './support/figures';

/**
 * Generated junk thrown at every body, query and path id the API takes (the routes come from the
 * role × route table, so a new route is fuzzed as soon as it has its rule). Each refusal must be a
 * 4xx in the API's error format, and the database must hold the same rows afterwards.
 * The seed is fixed so a failure replays; fast-check prints the counterexample and its path.
 */
const SEED = Number(process.env['RELIABILITY_SEED'] ?? 424242);
/** Junk requests per route and kind: enough to find a missing check, few enough for 2 cores. */
const RUNS = Number(process.env['RELIABILITY_FUZZ_RUNS'] ?? 12);

jest.setTimeout(120_000);

let testApp: TestApp;
let context: MatrixContext;
const tried = { bodies: 0, queries: 0, pathIds: 0 };

beforeAll(async () => {
  testApp = await createTestApp();
  context = await createMatrixContext(testApp);
});

afterAll(async () => {
  reportReliabilityFigures('bad input corpus (generated)', { seed: SEED, ...tried, total: tried.bodies + tried.queries + tried.pathIds });
  await testApp.close();
});

/** Row counts of every table: what "no change in the database" is checked against. */
async function rowCounts(): Promise<Record<string, number>> {
  const sequelize = testApp.database.sequelize;
  const isPostgres = sequelize.getDialect() === 'postgres';
  const tables = await sequelize.query<{ name: string }>(isPostgres
    ? "SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename"
    : "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name", { type: QueryTypes.SELECT });
  const counts: Record<string, number> = {};
  for (const { name } of tables) {
    const [row] = await sequelize.query<{ count: string | number }>(`SELECT COUNT(*) AS count FROM "${name}"`, { type: QueryTypes.SELECT });
    counts[name] = Number(row.count);
  }
  return counts;
}

const methodOf = (rule: RouteRule) => rule.route.split(' ')[0].toLowerCase() as 'get' | 'post' | 'put' | 'patch';
/** A role the rule allows (null for public routes), so the junk reaches the route's own checks. */
const callerOf = (rule: RouteRule): Role | null => (rule.allowed === 'public' ? null : rule.allowed.includes('geologist') ? 'geologist' : rule.allowed[0]);

function send(rule: RouteRule, url: string, role: Role | null, rawJson?: string) {
  let call = request(testApp.app)[methodOf(rule)](url);
  if (role) {
    call = call.set('Authorization', `Bearer ${context.tokens[role]}`);
  }
  return rawJson === undefined ? call : call.set('Content-Type', 'application/json').send(rawJson);
}

/** A refusal in the API's format: a 4xx with `{error: {code, message, details}}`. */
function expectRefusal(response: request.Response, what: string) {
  const shape = { status: response.status, hasCode: typeof response.body?.error?.code === 'string', hasMessage: typeof response.body?.error?.message === 'string', hasDetails: response.body?.error && 'details' in response.body.error };
  expect({ what, ...shape, isClientError: response.status >= 400 && response.status < 500 })
    .toEqual({ what, ...shape, isClientError: true, hasCode: true, hasMessage: true, hasDetails: true });
}

/** The push route answers a well-formed batch of bad records with 200 and each one rejected (kept on the device). */
function expectPushRefusal(response: request.Response, what: string) {
  if (response.status === 200) {
    const statuses = (response.body.results as { status: string }[]).map((result) => result.status);
    expect({ what, statuses: [...new Set(statuses)] }).toEqual({ what, statuses: ['rejected'] });
  } else {
    expectRefusal(response, what);
  }
}

type Leaf = { path: (string | number)[]; value: unknown };
/** Every non-null leaf of a JSON value, with its path. */
function leavesOf(value: unknown, path: (string | number)[] = []): Leaf[] {
  if (Array.isArray(value)) {
    return value.length === 0 ? [{ path, value }] : value.flatMap((item, index) => leavesOf(item, [...path, index]));
  }
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value);
    return entries.length === 0 ? [{ path, value }] : entries.flatMap(([key, item]) => leavesOf(item, [...path, key]));
  }
  return value === null ? [] : [{ path, value }];
}

function replaceAt(value: unknown, path: readonly (string | number)[], replacement: unknown): unknown {
  if (path.length === 0) {
    return replacement;
  }
  const [head, ...rest] = path;
  const copy = (Array.isArray(value) ? [...value] : { ...(value as object) }) as Record<string | number, unknown>;
  copy[head] = replaceAt(copy[head], rest, replacement);
  return copy;
}

/** A value of another JSON type than `original`, so the change can never be valid by chance. */
const wrongTypeFor = (original: unknown): fc.Arbitrary<unknown> => {
  const strings = fc.string({ maxLength: 40 });
  const numbers = fc.oneof(fc.integer(), fc.double({ noNaN: true, noDefaultInfinity: true }));
  const objects = fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 3 });
  const arrays = fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 3 });
  if (typeof original === 'string') return fc.oneof(numbers, fc.boolean(), objects, arrays);
  if (typeof original === 'number') return fc.oneof(strings, fc.boolean(), objects, arrays);
  if (typeof original === 'boolean') return fc.oneof(strings, numbers, objects, arrays);
  if (Array.isArray(original)) return fc.oneof(strings, numbers, fc.boolean(), objects);
  return fc.oneof(strings, numbers, fc.boolean(), arrays);
};

const jsonRules = ROUTE_RULES.filter((rule) => methodOf(rule) !== 'get');
const getRules = ROUTE_RULES.filter((rule) => methodOf(rule) === 'get');
const ruleCases = (rules: readonly RouteRule[]) => rules.map((rule) => [rule.route, rule] as const);

describe('junk JSON bodies', () => {
  describe.each(ruleCases(jsonRules))('%s', (route, rule) => {
    it('refuses a body of the wrong shape, and one with a field of the wrong type, with a 4xx and no change', async () => {
      const caller = callerOf(rule);
      const spec: RequestSpec = await rule.request(context, caller);
      const isPush = route === 'POST /api/sync/push';
      const leaves = spec.body === undefined ? [] : leavesOf(spec.body);
      const before = await rowCounts();
      // A whole body that is not an object at all, or an object of unknown fields.
      const wrongShape = fc.oneof(
        fc.oneof(fc.string(), fc.integer(), fc.boolean(), fc.constant(null), fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 4 })),
        fc.dictionary(fc.string({ minLength: 1, maxLength: 10 }).filter((key) => !(spec.body && typeof spec.body === 'object' && key in spec.body)), fc.jsonValue({ maxDepth: 2 }), { minKeys: 1, maxKeys: 4 }),
      );
      if (spec.body !== undefined) {
        await fc.assert(fc.asyncProperty(wrongShape, async (junk) => {
          tried.bodies += 1;
          const response = await send(rule, spec.url, caller, JSON.stringify(junk));
          expectRefusal(response, `${route} ${JSON.stringify(junk)}`);
        }), { seed: SEED, numRuns: RUNS });
      }
      if (leaves.length > 0) {
        const mutated = fc.nat({ max: leaves.length - 1 }).chain((index) => wrongTypeFor(leaves[index].value).map((junk) => replaceAt(spec.body, leaves[index].path, junk)));
        await fc.assert(fc.asyncProperty(mutated, async (body) => {
          tried.bodies += 1;
          const response = await send(rule, spec.url, caller, JSON.stringify(body));
          (isPush ? expectPushRefusal : expectRefusal)(response, `${route} ${JSON.stringify(body).slice(0, 400)}`);
        }), { seed: SEED, numRuns: RUNS * 2 });
      }
      expect(await rowCounts()).toEqual(before);
    });
  });
});

/** Ids a path might be given by someone trying to escape a folder or confuse a parser. */
const HOSTILE_IDS = ['..', '..%2F..%2Fetc%2Fpasswd', '%2e%2e%2f%2e%2e%2fheapsight.sqlite', '....%2F%2F', '%00', 'NaN', '-1', '1e400', `${'a'.repeat(300)}`, '%FF%FE', "'%20OR%201=1--"];

describe('hostile path ids', () => {
  const withIds = ROUTE_RULES.filter((rule) => rule.route.includes('/:'));
  describe.each(ruleCases(withIds))('%s', (route, rule) => {
    it('answers a 4xx for traversal, NUL, overlong and random ids, and changes nothing', async () => {
      const caller = callerOf(rule);
      const spec = await rule.request(context, caller);
      const pattern = rule.route.split(' ')[1];
      const before = await rowCounts();
      const ids = fc.oneof(fc.constantFrom(...HOSTILE_IDS), fc.string({ minLength: 1, maxLength: 30 }).map(encodeURIComponent));
      await fc.assert(fc.asyncProperty(ids, async (id) => {
        tried.pathIds += 1;
        // Every :param of the pattern gets the hostile id; the query of the working request stays.
        const [, query = ''] = spec.url.split('?');
        const url = pattern.replace(/:[A-Za-z]+/g, id) + (query ? `?${query}` : '');
        const body = spec.body === undefined ? undefined : JSON.stringify(spec.body);
        const response = await send(rule, url, caller, body);
        expectRefusal(response, `${route} → ${url}`);
      }), { seed: SEED, numRuns: RUNS });
      expect(await rowCounts()).toEqual(before);
    });
  });
});

describe('junk query strings', () => {
  describe.each(ruleCases(getRules))('%s', (route, rule) => {
    it('never answers 5xx to junk parameters; a refusal is a 4xx in the error format; nothing changes', async () => {
      const caller = callerOf(rule);
      const spec = await rule.request(context, caller);
      const [path, query = ''] = spec.url.split('?');
      const known = [...new URLSearchParams(query).keys(), 'since', 'limit', 'status', 'size', 'siteId', 'ownerId', 'ownerEntity', 'format', 'dryRun'];
      const before = await rowCounts();
      const parameters = fc.array(fc.tuple(
        fc.oneof(fc.constantFrom(...known), fc.string({ minLength: 1, maxLength: 12 })),
        fc.oneof(fc.string({ maxLength: 30 }), fc.constantFrom('-1', '1e309', 'NaN', '99999999999999999999', '[]', '{}', '../../etc', '%00')),
      ), { minLength: 1, maxLength: 4 });
      await fc.assert(fc.asyncProperty(parameters, async (pairs) => {
        tried.queries += 1;
        const search = pairs.map(([key, value]) => `${encodeURIComponent(key)}=${encodeURIComponent(value)}`).join('&');
        const response = await send(rule, `${path}?${search}`, caller);
        const what = `${route} ?${search}`;
        expect({ what, isServerError: response.status >= 500 }).toEqual({ what, isServerError: false });
        if (response.status >= 400) {
          expectRefusal(response, what);
        }
      }), { seed: SEED, numRuns: RUNS });
      expect(await rowCounts()).toEqual(before);
    });
  });
});
