import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { z } from 'zod';

/**
 * Configuration from environment variables, checked once at start-up so a typo stops the server
 * with a clear message instead of failing later. Everything the server writes lives under DATA_DIR.
 */
const environmentSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(4300),
  HOST: z.string().default('127.0.0.1'),
  DATA_DIR: z.string().default('data'),
  DATABASE_URL: z.string().optional(),
  /** Secret for signing access tokens; demo mode makes one per data folder when absent. */
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters').optional(),
  /** "1" seeds the invented demo scenario and runs the local fake SMTP server. */
  DEMO: z.enum(['0', '1']).default('0'),
  PUBLIC_URL: z.string().url().optional(),
  SMTP_HOST: z.string().optional(),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z.enum(['0', '1']).default('0'),
  MAIL_FROM: z.string().default('Heapsight <no-reply@heapsight.invalid>'),
  /** Optional map tile URL template for online deployments, e.g. https://tiles.example/{z}/{x}/{y}.png */
  MAP_TILE_URL: z.string().optional(),
  /** `disk` (DATA_DIR/photos, the default) or `s3://bucket[/prefix]` for S3-compatible storage. */
  PHOTO_STORE: z.string().regex(/^(disk|s3:\/\/.+)$/, 'PHOTO_STORE must be "disk" or s3://bucket[/prefix]').default('disk'),
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_FORCE_PATH_STYLE: z.enum(['0', '1']).default('1'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  STATIC_DIR: z.string().default('dist/heapsight/browser'),
});

/** The server's settings after validation. */
export interface Config {
  readonly environment: 'development' | 'production' | 'test';
  readonly port: number;
  readonly host: string;
  readonly dataDir: string;
  /** A Sequelize connection URL, or null for the embedded SQLite file in dataDir. */
  readonly databaseUrl: string | null;
  readonly sqliteFile: string;
  readonly jwtSecret: string | null;
  readonly isDemo: boolean;
  readonly publicUrl: string | null;
  readonly smtp: {
    readonly host: string | null;
    readonly port: number | null;
    readonly user: string | null;
    readonly password: string | null;
    readonly isSecure: boolean;
    readonly from: string;
  };
  readonly mapTileUrl: string | null;
  /** Where photo bytes go: the data folder, or an S3-compatible bucket. */
  readonly photoStore:
    | { readonly kind: 'disk' }
    | { readonly kind: 's3'; readonly location: string; readonly endpoint: string | null; readonly region: string; readonly forcePathStyle: boolean };
  readonly logLevel: string;
  readonly staticDir: string;
}

/** Reads and checks the environment; throws one error listing every bad variable. */
export function loadConfig(environment: NodeJS.ProcessEnv = process.env): Config {
  const parsed = environmentSchema.safeParse(environment);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid configuration:\n  ${problems.join('\n  ')}`);
  }
  const values = parsed.data;
  const dataDir = resolve(values.DATA_DIR);
  return {
    environment: values.NODE_ENV,
    port: values.PORT,
    host: values.HOST,
    dataDir,
    databaseUrl: values.DATABASE_URL ?? null,
    sqliteFile: join(dataDir, 'heapsight.sqlite'),
    jwtSecret: values.JWT_SECRET ?? null,
    isDemo: values.DEMO === '1',
    publicUrl: values.PUBLIC_URL ?? null,
    smtp: {
      host: values.SMTP_HOST ?? null,
      port: values.SMTP_PORT ?? null,
      user: values.SMTP_USER ?? null,
      password: values.SMTP_PASSWORD ?? null,
      isSecure: values.SMTP_SECURE === '1',
      from: values.MAIL_FROM,
    },
    mapTileUrl: values.MAP_TILE_URL ?? null,
    photoStore: values.PHOTO_STORE === 'disk'
      ? { kind: 'disk' }
      : { kind: 's3', location: values.PHOTO_STORE, endpoint: values.S3_ENDPOINT ?? null, region: values.S3_REGION, forcePathStyle: values.S3_FORCE_PATH_STYLE === '1' },
    logLevel: values.LOG_LEVEL,
    staticDir: resolve(values.STATIC_DIR),
  };
}

/** Makes sure the data folder exists before anything writes into it. */
export function ensureDataDir(config: Config): void {
  mkdirSync(config.dataDir, { recursive: true });
}
