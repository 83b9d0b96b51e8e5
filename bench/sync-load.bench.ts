/**
 * Sync under load: many devices push new samples and pull, for a bounded time, against the built
 * server in its own process on loopback. Every push and pull must answer 2xx, and every mutation
 * sent must be found by a pull afterwards. The figure is the push p99 latency; its same-run
 * baseline is the p99 of the cheapest route (GET /api/health), probed under the same load, so the
 * ratio says how much of a push's tail is the push itself rather than a busy machine.
 * Full: 100 devices for 60 s; smoke: 10 devices for 5 s.
 */
import { randomUUID } from 'node:crypto';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SITES } from '../server/demo/demo-scenario';
import { BENCH_SIZE, reportFigure } from './report';
import { startHeapsight } from './support/servers';

const DEVICES = BENCH_SIZE === 'full' ? 100 : 10;
const DURATION_MS = BENCH_SIZE === 'full' ? 60_000 : 5_000;
/** Samples per push: a crew's morning on one pile, as the phones send it. */
const SAMPLES_PER_PUSH = 20;
/** A request that takes longer than this counts as an error (bounded run). */
const REQUEST_TIMEOUT_MS = 30_000;
const sampler = DEMO_PEOPLE.find((person) => person.role === 'sampler') as (typeof DEMO_PEOPLE)[number];
const JR = DEMO_SITES[0];

function percentile(values: readonly number[], fraction: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted.length === 0 ? 0 : sorted[Math.min(sorted.length - 1, Math.floor(fraction * sorted.length))];
}

async function main(): Promise<void> {
  const server = await startHeapsight({ HOST: '127.0.0.1', LOG_LEVEL: 'error' });
  const errors: string[] = [];
  const pushMs: number[] = [];
  const healthMs: number[] = [];
  const sentSampleIds = new Set<string>();
  try {
    const login = await fetch(`${server.url}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: sampler.email, password: DEMO_PASSWORD }),
    });
    const { accessToken } = (await login.json()) as { accessToken: string };
    const headers = { 'content-type': 'application/json', authorization: `Bearer ${accessToken}` };
    const call = async (path: string, init: RequestInit = {}): Promise<unknown> => {
      const response = await fetch(`${server.url}${path}`, { ...init, headers, signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS) });
      const body = await response.json();
      if (!response.ok) {
        throw new Error(`${init.method ?? 'GET'} ${path}: HTTP ${response.status}`);
      }
      return body;
    };
    const startCursor = await latestCursor(call);
    const deadline = Date.now() + DURATION_MS;

    const device = async (index: number) => {
      const deviceId = randomUUID();
      const deviceNumber = String(100 + index);
      const pileId = randomUUID();
      let sequence = 0;
      let cursor = startCursor;
      const pile = {
        id: pileId, siteId: JR.id, code: `JR-${deviceNumber}-P0001`, material: 'sluice-tailings', footprint: null, heightM: 2, shapeModel: 'cone',
        angleOfReposeDeg: 34, bulkDensityTPerM3: null, moisturePct: null, spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: '',
      };
      let mutations: unknown[] = [{ mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null, data: pile }];
      // Bounded by the deadline and by a count, whichever comes first.
      for (let round = 0; round < 10_000 && Date.now() < deadline; round += 1) {
        for (let count = 0; count < SAMPLES_PER_PUSH; count += 1) {
          sequence += 1;
          const id = randomUUID();
          mutations.push({
            mutationId: randomUUID(), entity: 'sample', id, op: 'upsert', baseRevision: null, data: {
              id, pileId, code: `JR-${deviceNumber}-${String(sequence).padStart(5, '0')}`, sampleType: 'routine', duplicateOfId: null, standardId: null,
              location: null, gpsAccuracyM: null, wetMassKg: 10, moisturePct: null, increments: 10, position: 'toe',
              collectedAt: '2025-03-04T08:00:00.000Z', collectorId: sampler.id, deviceId,
            },
          });
          sentSampleIds.add(id);
        }
        try {
          const started = performance.now();
          const answer = (await call('/api/sync/push', { method: 'POST', body: JSON.stringify({ deviceId, mutations }) })) as { results: { status: string }[] };
          pushMs.push(performance.now() - started);
          const refused = answer.results.filter((result) => result.status !== 'applied');
          if (refused.length > 0) {
            errors.push(`device ${index}: ${refused.length} mutations ${refused[0].status}`);
          }
          mutations = [];
          const page = (await call(`/api/sync/pull?since=${cursor}&limit=1000`)) as { cursor: number };
          cursor = page.cursor;
        } catch (error) {
          errors.push(`device ${index}: ${(error as Error).message}`);
          return;
        }
      }
    };

    const probe = async () => {
      for (let round = 0; round < 100_000 && Date.now() < deadline; round += 1) {
        const started = performance.now();
        try {
          await call('/api/health');
          healthMs.push(performance.now() - started);
        } catch (error) {
          errors.push(`health: ${(error as Error).message}`);
          return;
        }
      }
    };
    await Promise.all([...Array.from({ length: DEVICES }, (_, index) => device(index)), probe()]);

    // Every sample sent is found by a pull from where the run began.
    const found = new Set<string>();
    let since = startCursor;
    for (let page = 0; page < 100_000; page += 1) {
      const answer = (await call(`/api/sync/pull?since=${since}&limit=1000`)) as { changes: { entity: string; id: string }[]; cursor: number; hasMore: boolean };
      answer.changes.filter((change) => change.entity === 'sample').forEach((change) => found.add(change.id));
      since = answer.cursor;
      if (!answer.hasMore) {
        break;
      }
    }
    const lost = [...sentSampleIds].filter((id) => !found.has(id)).length;
    const note = `${DEVICES} devices, ${DURATION_MS / 1000} s: ${pushMs.length} pushes, ${sentSampleIds.size} samples sent, ${lost} lost, ${errors.length} errors`;
    reportFigure({
      group: 'sync-load', name: `push p99 latency, ${DEVICES} devices for ${DURATION_MS / 1000} s`, value: percentile(pushMs, 0.99), unit: 'ms',
      baselineName: 'GET /api/health p99 under the same load', baselineValue: percentile(healthMs, 0.99), higherIsBetter: false,
      goal: 'no error response, no lost mutation', note,
    });
    reportFigure({ group: 'sync-load', name: `push p50 latency, ${DEVICES} devices`, value: percentile(pushMs, 0.5), unit: 'ms', higherIsBetter: false, note });
    reportFigure({ group: 'sync-load', name: 'sample mutations found after the run', value: sentSampleIds.size - lost, unit: 'mutations', higherIsBetter: true, note });
    process.stdout.write(`${note}\n`);
    if (errors.length > 0 || lost > 0) {
      process.stderr.write(`${errors.slice(0, 10).join('\n')}\n${lost} mutations lost\n`);
      process.exitCode = 1;
    }
  } finally {
    await server.stop();
  }
}

/** The server's current revision, read by paging a pull to its end. */
async function latestCursor(call: (path: string) => Promise<unknown>): Promise<number> {
  let since = 0;
  for (let page = 0; page < 100_000; page += 1) {
    const answer = (await call(`/api/sync/pull?since=${since}&limit=1000`)) as { cursor: number; hasMore: boolean };
    since = answer.cursor;
    if (!answer.hasMore) {
      return since;
    }
  }
  return since;
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exit(1);
});
