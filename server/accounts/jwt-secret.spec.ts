import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEMO_SECRET_FILE, resolveJwtSecret } from './jwt-secret';

describe('resolveJwtSecret', () => {
  let dataDir: string;

  beforeEach(() => {
    dataDir = mkdtempSync(join(tmpdir(), 'heapsight-secret-'));
  });

  afterEach(() => rmSync(dataDir, { recursive: true, force: true }));

  it('uses JWT_SECRET when it is set', () => {
    expect(resolveJwtSecret({ jwtSecret: 'x'.repeat(40), isDemo: true, dataDir })).toBe('x'.repeat(40));
  });

  it('in demo mode makes a secret once and reuses it after a restart, readable only by the owner', () => {
    const first = resolveJwtSecret({ jwtSecret: null, isDemo: true, dataDir });
    const second = resolveJwtSecret({ jwtSecret: null, isDemo: true, dataDir });
    expect(first.length).toBeGreaterThanOrEqual(32);
    expect(second).toBe(first);
    expect(readFileSync(join(dataDir, DEMO_SECRET_FILE), 'utf8').trim()).toBe(first);
    expect(statSync(join(dataDir, DEMO_SECRET_FILE)).mode & 0o077).toBe(0);
  });

  it('stops start-up outside demo mode when no secret is set, saying what to set', () => {
    expect(() => resolveJwtSecret({ jwtSecret: null, isDemo: false, dataDir })).toThrow(/JWT_SECRET is required outside demo mode/);
  });
});
