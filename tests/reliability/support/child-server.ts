/**
 * The real server (server/main.ts) in a child process, so a test can kill it with SIGKILL the way
 * a flat battery or the kernel's out-of-memory killer would, and start it again on the same data.
 * It runs through `node --import tsx` rather than the built dist/node, because Jest runs before the
 * build in `npm test`; and through node itself rather than the tsx launcher, because the launcher
 * starts a second process and a SIGKILL sent to it would never reach the server.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';

const ROOT = join(__dirname, '..', '..', '..');
/** Start-up takes ~3 s on an idle 2-core machine (migrations, demo seed); leave room for a busy one. */
const START_TIMEOUT_MS = 60_000;
/** A fixed secret, so access tokens signed before a crash still verify after the restart. */
export const CHILD_JWT_SECRET = 'reliability-tests-secret-long-enough-for-hs256';

/** A server started in its own process. */
export interface ChildServer {
  readonly url: string;
  readonly process: ChildProcess;
  output(): string;
  /** Kills the process at once (no shutdown hooks, no flush) and waits until it is gone. */
  kill(): Promise<void>;
  /** Asks it to stop as it would be stopped in service, and waits until it is gone. */
  stop(): Promise<void>;
}

/** Starts server/main.ts on a free loopback port over `dataDir` (demo data on first start). */
export async function startChildServer(dataDir: string, env: Record<string, string> = {}): Promise<ChildServer> {
  const child = spawn(process.execPath, ['--import', 'tsx', join(ROOT, 'server/main.ts')], {
    cwd: ROOT,
    env: {
      ...process.env, NODE_ENV: 'production', DEMO: '1', PORT: '0', HOST: '127.0.0.1', DATA_DIR: dataDir,
      LOG_LEVEL: 'warn', JWT_SECRET: CHILD_JWT_SECRET, STATIC_DIR: join(dataDir, 'no-static'), ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`the server did not start in ${START_TIMEOUT_MS} ms:\n${output}`));
    }, START_TIMEOUT_MS);
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /running at (http:\/\/\S+)/.exec(output);
      if (match) {
        clearTimeout(timer);
        resolve(match[1]);
      }
    });
    child.stderr?.on('data', (chunk: Buffer) => { output += chunk.toString(); });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the server exited (${code}) while starting:\n${output}`));
    });
  });
  const end = async (signal: NodeJS.Signals) => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill(signal);
    }
    await exited;
  };
  return { url, process: child, output: () => output, kill: () => end('SIGKILL'), stop: () => end('SIGTERM') };
}
