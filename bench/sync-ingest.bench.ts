/**
 * Sync ingest: sample mutations pushed to a real server on loopback in batches of 500, against
 * the raw rate of inserting the same rows straight into SQLite through the same driver
 * (Sequelize's bulkInsert over sqlite3, 500 rows per transaction) in the same run.
 * Goal from the issue: the API reaches at least a third of the raw rate. The server runs as the
 * built app in its own process (`startHeapsight`), so its peak RSS is its own, read from Linux's
 * /proc/<pid>/status (VmHWM) just before it stops.
 *
 * The machine is shared, so one pass of each can land in a busy second and the other in a quiet
 * one. The two are therefore measured in alternating rounds (raw, API, raw, API, …), each round
 * writing a fresh set of rows into the same growing tables, and the median round of each is reported.
 */
import { randomUUID } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openDatabase } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrator';
import { initModels } from '../server/db/models';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SITES } from '../server/demo/demo-scenario';
import { seedDemo } from '../server/demo/seed-demo';
import { loadConfig } from '../server/lib/config';
import { BENCH_SIZE, reportFigure, timeIt } from './report';
import { startHeapsight } from './support/servers';

const TOTAL = BENCH_SIZE === 'full' ? 10_000 : 2_000;
const BATCH = 500;
const ROUNDS = BENCH_SIZE === 'full' ? 5 : 3;
const sampler = DEMO_PEOPLE.find((person) => person.role === 'sampler') as (typeof DEMO_PEOPLE)[number];

function sampleData(pileId: string, round: number, index: number) {
  return {
    id: randomUUID(), pileId, code: `JR-${40 + round}-${String(index + 1).padStart(5, '0')}`, sampleType: 'routine', duplicateOfId: null, standardId: null,
    location: { type: 'Point', coordinates: [33.4523 + index * 1e-7, -4.0517] }, gpsAccuracyM: 4, wetMassKg: 10 + (index % 7), moisturePct: 8,
    increments: 10, position: 'mid-slope', collectedAt: new Date(Date.UTC(2025, 2, 4, 8, 0, index % 60)).toISOString(), collectorId: sampler.id, deviceId: 'bench-device',
  };
}

const median = (values: readonly number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

async function freshDatabase() {
  const dataDir = mkdtempSync(join(tmpdir(), 'heapsight-bench-'));
  const config = loadConfig({ NODE_ENV: 'production', DATA_DIR: dataDir, LOG_LEVEL: 'silent', STATIC_DIR: join(dataDir, 'none'), JWT_SECRET: 'bench-secret-that-is-long-enough-for-hs256' });
  const database = await openDatabase(config);
  initModels(database.sequelize);
  await migrateToLatest(database);
  await seedDemo(database);
  return { dataDir, config, database };
}

/** Peak resident set of a process in MB (Linux VmHWM), or null where /proc is not there. */
function peakRssMb(pid: number | undefined): number | null {
  try {
    const match = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return match ? Number(match[1]) / 1024 : null;
  } catch {
    return null;
  }
}

/** Pushes through the API of the built server: one round is TOTAL sample mutations in batches. */
async function startApi() {
  const server = await startHeapsight({ HOST: '127.0.0.1', LOG_LEVEL: 'error' });
  const base = server.url;
  const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: sampler.email, password: DEMO_PASSWORD }) });
  const { accessToken } = (await login.json()) as { accessToken: string };
  const headers = { 'content-type': 'application/json', authorization: `Bearer ${accessToken}` };
  const push = async (mutations: unknown[]) => {
    const response = await fetch(`${base}/api/sync/push`, { method: 'POST', headers, body: JSON.stringify({ deviceId: 'bench-device', mutations }) });
    const body = (await response.json()) as { results: { status: string }[] };
    if (!response.ok || body.results.some((result) => result.status !== 'applied')) {
      throw new Error(`push failed: ${response.status} ${JSON.stringify(body).slice(0, 300)}`);
    }
  };
  const pileId = randomUUID();
  await push([{ mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null, data: {
    id: pileId, siteId: DEMO_SITES[0].id, code: 'JR-42-P0001', material: 'mill-discharge', footprint: null, heightM: 2, shapeModel: 'cone',
    angleOfReposeDeg: 35, bulkDensityTPerM3: null, moisturePct: 6, spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: '',
  } }]);
  return {
    /** Records per second of one round. */
    async round(round: number): Promise<number> {
      const batches = Array.from({ length: TOTAL / BATCH }, (_, batch) =>
        Array.from({ length: BATCH }, (_, offset) => {
          const data = sampleData(pileId, round, batch * BATCH + offset);
          return { mutationId: randomUUID(), entity: 'sample', id: data.id, op: 'upsert', baseRevision: null, data };
        }));
      const { ms } = await timeIt(async () => {
        for (const batch of batches) {
          await push(batch);
        }
      });
      return TOTAL / (ms / 1000);
    },
    async stop(): Promise<number | null> {
      const peak = peakRssMb(server.process?.pid);
      await server.stop();
      return peak;
    },
  };
}

/** Inserts the same rows straight into a database of the same schema: one round is TOTAL rows. */
async function startRaw() {
  const { dataDir, database } = await freshDatabase();
  const pileId = randomUUID();
  const now = new Date();
  const owner = { createdById: sampler.id, createdAt: now, updatedAt: now, deletedAt: null };
  await database.transaction((transaction) => database.sequelize.getQueryInterface().bulkInsert('piles', [{
    id: pileId, siteId: DEMO_SITES[0].id, code: 'JR-42-P0001', material: 'mill-discharge', footprint: null, heightM: 2, shapeModel: 'cone',
    angleOfReposeDeg: 35, bulkDensityTPerM3: null, moisturePct: 6, spotHeights: null, sackCount: null, sackMassKg: null, hazards: '[]', notes: '',
    deviceId: 'bench-device', revision: 1, ...owner,
  }], { transaction }));
  let revision = 1;
  return {
    async round(round: number): Promise<number> {
      const rows = Array.from({ length: TOTAL }, (_, index) => {
        const data = sampleData(pileId, round, index);
        revision += 1;
        return { ...data, siteId: DEMO_SITES[0].id, location: JSON.stringify(data.location), collectedAt: new Date(data.collectedAt), revision, ...owner };
      });
      const { ms } = await timeIt(async () => {
        for (let start = 0; start < rows.length; start += BATCH) {
          await database.transaction((transaction) => database.sequelize.getQueryInterface().bulkInsert('samples', rows.slice(start, start + BATCH), { transaction }));
        }
      });
      return TOTAL / (ms / 1000);
    },
    async stop(): Promise<void> {
      await database.close();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

async function main(): Promise<void> {
  const raw = await startRaw();
  const api = await startApi();
  const rawRates: number[] = [];
  const apiRates: number[] = [];
  let serverPeakRssMb: number | null;
  try {
    for (let round = 1; round <= ROUNDS; round += 1) {
      rawRates.push(await raw.round(round));
      apiRates.push(await api.round(round));
    }
  } finally {
    // A failed round must not leave the server process running behind the benchmark.
    serverPeakRssMb = await api.stop();
    await raw.stop();
  }
  const rounds = rawRates.map((rate, index) => `${Math.round(apiRates[index])}/${Math.round(rate)}`).join(', ');
  reportFigure({
    group: 'sync', name: `push ${TOTAL.toLocaleString('en')} sample mutations, batches of ${BATCH}, loopback (median of ${ROUNDS} rounds)`,
    value: median(apiRates), unit: 'records/s',
    baselineName: 'raw bulkInsert into SQLite (same driver)', baselineValue: median(rawRates), higherIsBetter: true, goal: '>= 1/3 of raw (ratio >= 0.33)',
    note: `rounds, API/raw records/s: ${rounds}`,
  });
  if (serverPeakRssMb !== null) {
    reportFigure({ group: 'sync', name: 'peak RSS of the server process during the push', value: serverPeakRssMb, unit: 'MB', higherIsBetter: false });
  }
}

void main().catch((error: unknown) => {
  process.stderr.write(`${String(error)}\n`);
  process.exit(1);
});
