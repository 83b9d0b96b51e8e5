#!/usr/bin/env node
// Runs every e2e/*.e2e.mjs with node's test runner, one file at a time (2-core machines).
// Needs the built app and server: `npm run build` first (npm test does it).
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { CHROMIUM_PATH, ROOT } from './harness.mjs';

for (const required of ['dist/heapsight/browser/index.html', 'dist/node/server/main.js']) {
  if (!existsSync(join(ROOT, required))) {
    console.error(`Missing ${required}: run "npm run build" first.`);
    process.exit(1);
  }
}
if (!existsSync(CHROMIUM_PATH)) {
  console.error(`Chromium not found at ${CHROMIUM_PATH}. Install it: sudo apt-get install -y chromium`);
  process.exit(1);
}
const wanted = process.argv.slice(2);
const files = readdirSync(join(ROOT, 'e2e'))
  .filter((file) => file.endsWith('.e2e.mjs'))
  .filter((file) => wanted.length === 0 || wanted.some((name) => file.includes(name)))
  .sort()
  .map((file) => join('e2e', file));
const result = spawnSync(process.execPath, ['--test', '--test-reporter=spec', ...files], { cwd: ROOT, stdio: 'inherit' });
process.exit(result.status ?? 1);
