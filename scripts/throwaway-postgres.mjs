// A throw-away PostgreSQL cluster on loopback for the server test suite: initdb into a temp
// folder, start on a free port, and stop + delete at the end. Uses Debian's postgresql binaries;
// as root it installs them when missing and runs the server as the `postgres` system user
// (PostgreSQL refuses to run as root).
import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const isRoot = process.getuid?.() === 0;

/** The folder holding initdb and pg_ctl of the newest installed major version, or null. */
export function findPostgresBin() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base).filter((name) => existsSync(join(base, name, 'bin/initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(base, versions[0], 'bin') : null;
}

/** Installs Debian's postgresql when we may (root), returning the bin folder or null. */
export function ensurePostgres() {
  const found = findPostgresBin();
  if (found || !isRoot) return found;
  spawnSync('bash', ['-c', 'apt-get update -q && DEBIAN_FRONTEND=noninteractive apt-get install -y -q postgresql'], { stdio: 'inherit' });
  return findPostgresBin();
}

function freePort() {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

/** Starts a cluster; resolves to { url, stop() }. */
export async function startThrowawayPostgres(bin) {
  const folder = mkdtempSync(join(tmpdir(), 'heapsight-pg-'));
  const dataDir = join(folder, 'data');
  const port = await freePort();
  const asOwner = (command, args) => {
    const file = join(bin, command);
    const full = isRoot ? ['runuser', ['-u', 'postgres', '--', file, ...args]] : [file, args];
    execFileSync(full[0], full[1], { stdio: ['ignore', 'ignore', 'inherit'] });
  };
  if (isRoot) {
    chmodSync(folder, 0o777);
  }
  asOwner('initdb', ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--no-sync']);
  asOwner('pg_ctl', ['-D', dataDir, '-l', join(folder, 'server.log'), '-w', '-o',
    `-p ${port} -k ${folder} -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=200`, 'start']);
  return {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    stop() {
      try {
        asOwner('pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', 'stop']);
      } finally {
        rmSync(folder, { recursive: true, force: true });
      }
    },
  };
}
