#!/usr/bin/env node
// `npm start`: builds what is missing or stale (client, server), then runs the server on its
// embedded default — SQLite in data/, demo data, local fake mail — unless the environment says otherwise.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

const root = new URL('..', import.meta.url).pathname;
const bin = (name) => join(root, 'node_modules/.bin', name);

/** Newest modification time of any file under these folders (skipping specs). */
function newestSource(folders) {
  let newest = 0;
  const walk = (path) => {
    const stats = statSync(path);
    if (stats.isDirectory()) {
      for (const entry of readdirSync(path)) walk(join(path, entry));
    } else if (!/\.(spec|test)\.ts$/.test(path)) {
      newest = Math.max(newest, stats.mtimeMs);
    }
  };
  for (const folder of folders) {
    if (existsSync(join(root, folder))) walk(join(root, folder));
  }
  return newest;
}

function isStale(output, folders) {
  const target = join(root, output);
  return !existsSync(target) || statSync(target).mtimeMs < newestSource(folders);
}

function run(command, args) {
  const result = spawnSync(command, args, { cwd: root, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false' } });
  if (result.status !== 0) process.exit(result.status ?? 1);
}

if (isStale('dist/heapsight/browser/index.html', ['src', 'shared', 'assets', 'angular.json', 'ngsw-config.json'])) {
  console.log('Building the app (about a minute the first time)…');
  run(bin('ng'), ['build']);
}
if (isStale('dist/node/server/main.js', ['server', 'shared'])) {
  console.log('Building the server…');
  run(bin('tsc'), ['-p', 'tsconfig.build-server.json']);
}

const env = { NODE_ENV: 'production', DEMO: '1', ...process.env };
const server = spawn(process.execPath, [join(root, 'dist/node/server/main.js')], { cwd: root, stdio: 'inherit', env });
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => server.kill(signal));
}
server.on('exit', (code) => process.exit(code ?? 0));
