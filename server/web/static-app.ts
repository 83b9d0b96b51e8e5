import compression from 'compression';
import express, { Router } from 'express';
import { existsSync } from 'node:fs';
import { join } from 'node:path';

/** Files whose names carry a content hash never change, so browsers may keep them a year. */
const HASHED_FILE = /[.-][A-Z0-9]{8,}\.(js|css|woff2?|png|svg|jpg|webp)$/i;
/** Files that name the current version must be revalidated on every visit. */
const ALWAYS_REVALIDATE = new Set(['index.html', 'ngsw.json', 'ngsw-worker.js', 'safety-worker.js', 'worker-basic.min.js', 'manifest.webmanifest']);

/**
 * Serves the built Angular app: compressed, long-cached hashed files, `no-cache` for the files that
 * name the version, and index.html for any other GET that is not the API (client-side routes).
 */
export function staticApp(staticDir: string): Router {
  const router = Router();
  const indexFile = join(staticDir, 'index.html');
  router.use(compression());
  router.use(
    express.static(staticDir, {
      index: false,
      setHeaders(response, filePath) {
        const name = filePath.split(/[\\/]/).pop() ?? '';
        if (ALWAYS_REVALIDATE.has(name)) {
          response.setHeader('Cache-Control', 'no-cache');
        } else if (HASHED_FILE.test(name)) {
          response.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        } else {
          response.setHeader('Cache-Control', 'public, max-age=3600');
        }
      },
    }),
  );
  router.get('/{*clientRoute}', (request, response, next) => {
    if (request.path.startsWith('/api/') || !existsSync(indexFile)) {
      next();
      return;
    }
    response.setHeader('Cache-Control', 'no-cache');
    response.sendFile(indexFile);
  });
  return router;
}
