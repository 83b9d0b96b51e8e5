import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Config } from '../lib/config';

/** Where demo mode keeps the secret it made, so tokens survive a restart. */
export const DEMO_SECRET_FILE = 'jwt-secret';

/**
 * The secret that signs access tokens: JWT_SECRET when set; in demo mode a random one made once per
 * data folder; otherwise start-up stops with a message saying what to set.
 */
export function resolveJwtSecret(config: Pick<Config, 'jwtSecret' | 'isDemo' | 'dataDir'>): string {
  if (config.jwtSecret) {
    return config.jwtSecret;
  }
  if (!config.isDemo) {
    throw new Error('JWT_SECRET is required outside demo mode: set it to a random string of 32 or more characters');
  }
  const file = join(config.dataDir, DEMO_SECRET_FILE);
  if (existsSync(file)) {
    return readFileSync(file, 'utf8').trim();
  }
  const secret = randomBytes(48).toString('base64url');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}
