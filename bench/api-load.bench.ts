/**
 * The API under load: autocannon on loopback against the built server (its own process, SQLite,
 * as `npm start` runs it) holding the seeded synthetic site (full: 50 piles, 20,000 samples,
 * 2,000 photos). Each read is measured beside `GET /api/health` on the same server in the same run
 * (helmet, logging and JSON like every route, plus one `SELECT 1`), so the ratio is what our route
 * costs over the framework's floor; `GET /api/me` is measured too, as the floor of any signed-in
 * read (token check and user loaded fresh). Goal (issue 9): p99 < 50 ms at 50 connections for
 * paged reads. Also the size of the site map's answer beside the full review, and the shortlist's
 * first answer after a write (when the kept site data is read again).
 * Every run is bounded in time (seconds per route); nothing here asserts a timing.
 */
import autocannon from 'autocannon';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SYNTHETIC_SITE, SYNTHETIC_SIZES, seedSyntheticDataDir } from '../scripts/make-synthetic-site';
import { BENCH_SIZE, reportFigure } from './report';
import { startHeapsight } from './support/servers';

const isFull = BENCH_SIZE === 'full';
const size = SYNTHETIC_SIZES[BENCH_SIZE];
const CONNECTIONS = 50;
const DURATION_S = isFull ? 10 : 2;
const PAGE = 50;

async function signIn(url: string, email: string): Promise<string> {
  const response = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: 'heapsight-demo' }) });
  if (!response.ok) throw new Error(`sign-in of ${email} failed: ${response.status}`);
  return ((await response.json()) as { accessToken: string }).accessToken;
}

/** Paths spread over the whole list so each request reads a different page. */
function spread(count: number, make: (index: number) => string): { path: string }[] {
  return Array.from({ length: count }, (_, index) => ({ path: make(index) }));
}

async function main(): Promise<void> {
  const dataDir = mkdtempSync(join(tmpdir(), 'heapsight-bench-api-'));
  const seeded = await seedSyntheticDataDir(dataDir, size);
  process.stdout.write(`synthetic site: ${size.piles} piles, ${size.samples} samples, ${size.photos} photos (${seeded.applied} records) in ${(seeded.ms / 1000).toFixed(1)} s\n`);
  const server = await startHeapsight({}, dataDir);
  try {
    const geologist = await signIn(server.url, 'geologist@demo.heapsight.test');
    const manager = await signIn(server.url, 'manager@demo.heapsight.test');
    const site = SYNTHETIC_SITE.id;
    const pages = Math.floor(size.samples / PAGE);
    const load = async (token: string, requests: { path: string }[], connections = CONNECTIONS) => {
      // Warm the route (first query compiles statements and fills the page cache) before measuring.
      for (const request of requests.slice(0, 3)) {
        const response = await fetch(`${server.url}${request.path}`, { headers: { authorization: `Bearer ${token}` } });
        if (!response.ok) throw new Error(`${request.path}: ${response.status} ${(await response.text()).slice(0, 200)}`);
      }
      const result = await autocannon({ url: server.url, connections, duration: DURATION_S, timeout: 30, headers: { authorization: `Bearer ${token}` }, requests });
      if (result.errors + result.timeouts + result.non2xx > 0) {
        throw new Error(`${requests[0].path}: ${result.errors} errors, ${result.timeouts} timeouts, ${result.non2xx} non-2xx`);
      }
      return result;
    };
    const baseline = await load(geologist, [{ path: '/api/health' }]);
    // GET /api/me is the floor of any signed-in read: the token check and the user loaded fresh
    // (one query: user, revoked sign-in and memberships), plus the profile's sites and device; a
    // paged read cannot be cheaper than that.
    const routes = [
      { name: 'GET /api/me (sign-in floor of every signed-in read)', token: geologist, requests: [{ path: '/api/me' }], isPagedRead: false },
      { name: `GET /api/samples paged (${PAGE} of ${size.samples.toLocaleString('en')}, pages all over)`, token: geologist, requests: spread(40, (index) => `/api/samples?siteId=${site}&limit=${PAGE}&offset=${((index * 37) % pages) * PAGE}`), isPagedRead: true },
      { name: 'GET /api/samples filtered (type + code prefix + date range), paged', token: geologist, requests: spread(40, (index) => `/api/samples?siteId=${site}&sampleType=routine&codePrefix=SY-&collectedFrom=2025-01-06T00:00:00Z&collectedTo=2030-01-01T00:00:00Z&limit=${PAGE}&offset=${((index * 37) % pages) * PAGE}`), isPagedRead: true },
      { name: 'GET /api/sync/pull (500 changes a page, cursors all over)', token: geologist, requests: spread(20, (index) => `/api/sync/pull?since=${Math.floor((index * seeded.applied) / 20)}&limit=500`), isPagedRead: true },
      { name: `GET /api/shortlist (${size.piles} piles ranked from ${size.samples.toLocaleString('en')} samples)`, token: manager, requests: [{ path: `/api/shortlist?site=${site}` }], isPagedRead: false },
      // Whole-site answers of a megabyte and more: fewer connections keep them inside the time bound.
      { name: `GET /api/review/sites/:id?view=map (site map, ${size.samples.toLocaleString('en')} samples)`, token: geologist, requests: [{ path: `/api/review/sites/${site}?view=map` }], isPagedRead: false, connections: 10 },
      { name: `GET /api/review/sites/:id (full review, ${size.samples.toLocaleString('en')} samples)`, token: geologist, requests: [{ path: `/api/review/sites/${site}` }], isPagedRead: false, connections: 4 },
    ];
    for (const route of routes) {
      const connections = route.connections ?? CONNECTIONS;
      const result = await load(route.token, route.requests, connections);
      if (result.requests.total === 0) {
        // Not one answer inside the time bound: report the time of one request alone instead.
        const started = Date.now();
        await fetch(`${server.url}${route.requests[0].path}`, { headers: { authorization: `Bearer ${route.token}` } });
        reportFigure({ group: 'api', name: `${route.name}: one request alone (none finished under load in ${DURATION_S} s)`, value: Date.now() - started, unit: 'ms', baselineName: 'GET /api/health p50, same server', baselineValue: Math.max(baseline.latency.p50, 1), higherIsBetter: false });
        continue;
      }
      process.stdout.write(`${route.name} (${connections} connections): ${result.requests.average.toFixed(0)} req/s, p50 ${result.latency.p50} ms, p99 ${result.latency.p99} ms (health: ${baseline.requests.average.toFixed(0)} req/s, p99 ${baseline.latency.p99} ms)\n`);
      const common = { group: 'api', baselineName: 'GET /api/health, same server (50 connections)', note: `${connections} connections, ${DURATION_S} s, loopback` };
      reportFigure({ ...common, name: `${route.name}: requests/s`, value: result.requests.average, unit: 'req/s', baselineValue: baseline.requests.average, higherIsBetter: true });
      reportFigure({ ...common, name: `${route.name}: p50 latency`, value: Math.max(result.latency.p50, 0.01), unit: 'ms', baselineValue: Math.max(baseline.latency.p50, 0.01), higherIsBetter: false });
      reportFigure({
        ...common, name: `${route.name}: p99 latency`, value: result.latency.p99, unit: 'ms', baselineValue: baseline.latency.p99, higherIsBetter: false,
        ...(route.isPagedRead ? { goal: `< 50 ms at ${CONNECTIONS} connections (full size)` } : {}),
      });
    }

    // Payload of the site map's answer beside the full review it was cut from.
    const bytesOf = async (path: string) => (await (await fetch(`${server.url}${path}`, { headers: { authorization: `Bearer ${geologist}` } })).arrayBuffer()).byteLength;
    const fullBytes = await bytesOf(`/api/review/sites/${site}`);
    const mapBytes = await bytesOf(`/api/review/sites/${site}?view=map`);
    process.stdout.write(`site review payload: full ${fullBytes.toLocaleString('en')} bytes, map view ${mapBytes.toLocaleString('en')} bytes\n`);
    reportFigure({ group: 'api', name: `GET /api/review/sites/:id?view=map payload (${size.samples.toLocaleString('en')} samples)`, value: mapBytes / 1e6, unit: 'MB', baselineName: 'the full review of the same site', baselineValue: fullBytes / 1e6, higherIsBetter: false });

    // After a write, the first answer reads the site again (samples kept per data revision): one
    // request alone, beside the warm answer measured under load above.
    const pileList = (await (await fetch(`${server.url}/api/piles?siteId=${site}&limit=1`, { headers: { authorization: `Bearer ${geologist}` } })).json()) as { items: { id: string; revision: number; notes: string }[] };
    const [pile] = pileList.items;
    const edited = await fetch(`${server.url}/api/piles/${pile.id}`, {
      method: 'PATCH', headers: { authorization: `Bearer ${geologist}`, 'content-type': 'application/json' },
      body: JSON.stringify({ baseRevision: pile.revision, changes: { notes: `${pile.notes} (edited by the bench)` } }),
    });
    if (!edited.ok) throw new Error(`pile edit: ${edited.status} ${(await edited.text()).slice(0, 200)}`);
    const coldStarted = Date.now();
    const cold = await fetch(`${server.url}/api/shortlist?site=${site}`, { headers: { authorization: `Bearer ${manager}` } });
    await cold.arrayBuffer();
    const coldMs = Date.now() - coldStarted;
    const warmStarted = Date.now();
    await (await fetch(`${server.url}/api/shortlist?site=${site}`, { headers: { authorization: `Bearer ${manager}` } })).arrayBuffer();
    const warmMs = Date.now() - warmStarted;
    process.stdout.write(`GET /api/shortlist alone: first after a pile edit ${coldMs} ms, next ${warmMs} ms\n`);
    reportFigure({ group: 'api', name: 'GET /api/shortlist, first answer after a pile edit (site read again), one request alone', value: coldMs, unit: 'ms', baselineName: 'the next answer (kept site data)', baselineValue: Math.max(warmMs, 1), higherIsBetter: false });
  } finally {
    await server.stop();
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exit(1);
});
