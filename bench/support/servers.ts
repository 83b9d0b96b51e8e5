import { spawn, type ChildProcess } from 'node:child_process';
import express from 'express';
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** The repository root (benchmarks run from anywhere). */
export const ROOT = join(__dirname, '..', '..');
export const STATIC_DIR = join(ROOT, 'dist/heapsight/browser');
/** The built server (`npm run build`); BENCH_SERVER_DIR points at another build, e.g. one made with `tsc --outDir`. */
export const SERVER_DIR = process.env['BENCH_SERVER_DIR'] ?? join(ROOT, 'dist/node');

/** A server started for a benchmark, with its URL and how to stop it. */
export interface BenchServer {
  readonly url: string;
  readonly process?: ChildProcess;
  readonly dataDir?: string;
  stop(): Promise<void>;
}

/**
 * The real built server (dist/node) in its own process on a free port with a fresh data folder
 * and the demo scenario, as `npm start` runs it. With `givenDataDir` (e.g. one holding the synthetic
 * site) it uses that folder instead, and removes it on stop.
 */
export async function startHeapsight(env: Record<string, string> = {}, givenDataDir?: string): Promise<BenchServer> {
  const dataDir = givenDataDir ?? mkdtempSync(join(tmpdir(), 'heapsight-bench-'));
  const child = spawn(process.execPath, [join(SERVER_DIR, 'server/main.js')], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'production', DEMO: '1', PORT: '0', DATA_DIR: dataDir, LOG_LEVEL: 'warn', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const url = await new Promise<string>((resolve, reject) => {
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /running at (http:\/\/\S+)/.exec(output);
      if (match) resolve(match[1]);
    });
    child.stderr?.on('data', (chunk: Buffer) => { output += chunk.toString(); });
    child.on('exit', (code) => reject(new Error(`server exited ${code}: ${output}`)));
  });
  return {
    url,
    process: child,
    dataDir,
    async stop() {
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      await exited;
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** The baseline: the same built app from plain `express.static` (no compression, default caching). */
export async function startPlainStatic(): Promise<BenchServer> {
  const app = express();
  app.use(express.static(STATIC_DIR));
  app.get('/{*route}', (_request, response) => response.sendFile(join(STATIC_DIR, 'index.html')));
  const server: Server = await new Promise((resolve) => {
    const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
