import compression from 'compression';
import express, { Router, type Request, type Response } from 'express';
import { existsSync } from 'node:fs';
import { stat } from 'node:fs/promises';
import { extname, join, normalize, sep } from 'node:path';

/** Files whose names carry a content hash never change, so browsers may keep them a year. */
const HASHED_FILE = /[.-][A-Z0-9]{8,}\.(js|css|woff2?|png|svg|jpg|webp)$/i;
/** Files that name the current version must be revalidated on every visit. */
const ALWAYS_REVALIDATE = new Set(['index.html', 'ngsw.json', 'ngsw-worker.js', 'safety-worker.js', 'worker-basic.min.js', 'manifest.webmanifest']);

/**
 * Copies written beside the build's text files by scripts/precompress.mjs, best first. Brotli is
 * about a fifth smaller than gzip for our scripts, and neither costs the server any CPU per request.
 */
const PRECOMPRESSED = [
  { encoding: 'br', suffix: '.br' },
  { encoding: 'gzip', suffix: '.gz' },
] as const;

/** Content types of the files that have precompressed copies (the copies' own names say nothing). */
const CONTENT_TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.webmanifest': 'application/manifest+json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.txt': 'text/plain; charset=utf-8',
};

/** The Cache-Control a built file is sent with. */
export function cacheControlFor(fileName: string): string {
  if (ALWAYS_REVALIDATE.has(fileName)) return 'no-cache';
  if (HASHED_FILE.test(fileName)) return 'public, max-age=31536000, immutable';
  return 'public, max-age=3600';
}

/** The file under `staticDir` a URL path names, or null for one that climbs out or is not a plain path. */
function fileUnder(staticDir: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes('\0')) return null;
  const file = normalize(join(staticDir, decoded));
  return file.startsWith(staticDir + sep) ? file : null;
}

async function modifiedAt(file: string): Promise<number | null> {
  try {
    const found = await stat(file);
    return found.isFile() ? found.mtimeMs : null;
  } catch {
    return null;
  }
}

/**
 * Sends the precompressed copy of `file` the request accepts (brotli before gzip), with its
 * Content-Encoding, the original's Content-Type and Cache-Control, and `Vary: Accept-Encoding`.
 * A copy older than its file (left from an earlier build) is ignored. Answers false, sending
 * nothing, when the file has no copies or the client takes none of them.
 */
async function sendPrecompressed(request: Request, response: Response, file: string): Promise<boolean> {
  const contentType = CONTENT_TYPES[extname(file).toLowerCase()];
  if (!contentType) return false;
  const original = await modifiedAt(file);
  if (original === null) return false;
  const copies: { encoding: string; path: string }[] = [];
  for (const { encoding, suffix } of PRECOMPRESSED) {
    const copyModified = await modifiedAt(file + suffix);
    if (copyModified !== null && copyModified >= original) copies.push({ encoding, path: file + suffix });
  }
  if (copies.length === 0) return false;
  response.vary('Accept-Encoding');
  // Our order decides between encodings the client takes (browsers list gzip before br).
  const copy = copies.find((candidate) => request.acceptsEncodings(candidate.encoding) === candidate.encoding);
  if (!copy) return false;
  response.setHeader('Content-Type', contentType);
  response.setHeader('Content-Encoding', copy.encoding);
  response.setHeader('Cache-Control', cacheControlFor(file.split(sep).pop() ?? ''));
  await new Promise<void>((resolve, reject) => {
    response.sendFile(copy.path, { cacheControl: false, dotfiles: 'deny' }, (error) => (error ? reject(error) : resolve()));
  });
  return true;
}

/**
 * Serves the built Angular app: precompressed copies where the build wrote them (otherwise
 * compressed on the fly), long-cached hashed files, `no-cache` for the files that name the version,
 * and index.html for any other GET that is not the API (client-side routes).
 */
export function staticApp(staticDir: string): Router {
  const router = Router();
  const root = normalize(staticDir).replace(/[\\/]+$/, '');
  const indexFile = join(root, 'index.html');
  router.use(compression());
  router.use(async (request, response, next) => {
    if ((request.method !== 'GET' && request.method !== 'HEAD') || request.path.startsWith('/api/')) {
      next();
      return;
    }
    const file = fileUnder(root, request.path);
    if (file && file !== root && (await sendPrecompressed(request, response, file))) return;
    next();
  });
  router.use(
    express.static(root, {
      index: false,
      setHeaders(response, filePath) {
        response.setHeader('Cache-Control', cacheControlFor(filePath.split(/[\\/]/).pop() ?? ''));
      },
    }),
  );
  router.get('/{*clientRoute}', async (request, response, next) => {
    if (request.path.startsWith('/api/') || !existsSync(indexFile)) {
      next();
      return;
    }
    if (await sendPrecompressed(request, response, indexFile)) return;
    response.setHeader('Cache-Control', 'no-cache');
    response.sendFile(indexFile);
  });
  return router;
}
