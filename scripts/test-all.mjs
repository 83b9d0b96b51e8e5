#!/usr/bin/env node
// `npm test`: every test there is, in the order that fails fastest —
// type checks, unit and integration tests (Jest, with shared/ coverage enforced),
// the production build (with its size budgets), then the end-to-end tests in headless Chromium.
// Installs Debian's chromium first when it is missing and we are root; otherwise says what to install.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensurePostgres, startThrowawayPostgres } from './throwaway-postgres.mjs';

const root = new URL('..', import.meta.url).pathname;
const bin = (name) => join(root, 'node_modules/.bin', name);
const env = { ...process.env, NG_CLI_ANALYTICS: 'false' };
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

function step(title, command, args) {
  console.log(`\n▶ ${title}`);
  const result = spawnSync(command, args, { cwd: root, stdio: 'inherit', env });
  if (result.status !== 0) {
    console.error(`\n✖ ${title} failed (exit ${result.status})`);
    process.exit(result.status ?? 1);
  }
}

if (!existsSync(CHROMIUM)) {
  if (process.getuid?.() === 0) {
    step('Installing Debian chromium for the end-to-end tests', 'bash', ['-c', 'apt-get update && apt-get install -y chromium']);
  } else {
    console.error(`Chromium is needed for the end-to-end tests. Install it with:\n  sudo apt-get install -y chromium`);
    process.exit(1);
  }
}

step('Type check (server, shared, tests)', bin('tsc'), ['--noEmit', '-p', 'tsconfig.server.json']);
const jestReport = join(mkdtempSync(join(tmpdir(), 'heapsight-jest-')), 'report.json');
step('Unit and integration tests (Jest)', bin('jest'), ['--coverage', '--json', `--outputFile=${jestReport}`]);
// The server suite again on a real PostgreSQL server (throw-away cluster on loopback), so the
// same migrations and queries are proven on both databases.
const postgresBin = ensurePostgres();
let postgresReport = null;
if (postgresBin) {
  const postgres = await startThrowawayPostgres(postgresBin);
  try {
    postgresReport = join(mkdtempSync(join(tmpdir(), 'heapsight-jest-pg-')), 'report.json');
    env.TEST_DATABASE_URL = postgres.url;
    step('Server integration tests on PostgreSQL', bin('jest'), ['--selectProjects', 'server', '--json', `--outputFile=${postgresReport}`]);
  } finally {
    delete env.TEST_DATABASE_URL;
    postgres.stop();
  }
} else {
  console.error('PostgreSQL is not installed (apt-get install -y postgresql): the PostgreSQL run is skipped.');
}

step('Production build of the app (budgets enforced)', bin('ng'), ['build']);
step('Initial bundle gzip size (180 kB budget)', process.execPath, [join(root, 'scripts/check-bundle-size.mjs')]);
step('Build of the server', bin('tsc'), ['-p', 'tsconfig.build-server.json']);
const e2e = spawnSync(process.execPath, [join(root, 'e2e/run.mjs')], { cwd: root, env, encoding: 'utf8', stdio: ['inherit', 'pipe', 'inherit'] });
process.stdout.write(e2e.stdout);

const jest = JSON.parse(readFileSync(jestReport, 'utf8'));
const e2ePassed = Number(/ℹ pass (\d+)/.exec(e2e.stdout)?.[1] ?? 0);
const e2eFailed = Number(/ℹ fail (\d+)/.exec(e2e.stdout)?.[1] ?? (e2e.status === 0 ? 0 : 1));
const onPostgres = postgresReport ? JSON.parse(readFileSync(postgresReport, 'utf8')) : { numPassedTests: 0, numFailedTests: 0 };
const passed = jest.numPassedTests + onPostgres.numPassedTests + e2ePassed;
const failed = jest.numFailedTests + onPostgres.numFailedTests + e2eFailed;
console.log(`\nJest: ${jest.numPassedTests} passed; server on PostgreSQL: ${onPostgres.numPassedTests} passed; ` +
  `end-to-end: ${e2ePassed} passed, ${e2eFailed} failed`);
console.log(`tests: ${passed} passed, ${failed} failed`);
process.exit(failed === 0 && e2e.status === 0 ? 0 : 1);
