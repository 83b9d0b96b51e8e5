import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { PHOTO_CONTENT_TYPES } from '../../shared/sync/protocol';
import { currentUser } from '../accounts/current-user';
import type { Config } from '../lib/config';
import { AppError } from '../lib/errors';
import { parseOrThrow } from '../lib/validate';
import type { ReviewService } from './review.service';
import { MAX_SITE_IMAGE_BYTES, type SiteImageService } from './site-image.service';

const noQuery = z.strictObject({});
/** `view=map`: the compact answer the site map reads; without it, the full review. */
const siteReviewQuery = z.strictObject({ view: z.enum(['full', 'map'], 'view is full or map').optional() });
const pileParams = z.strictObject({ id: z.uuid('Not a pile id') });
const siteParams = z.strictObject({ siteId: z.uuid('Not a site id') });
const imageSiteParams = z.strictObject({ id: z.uuid('Not a site id') });
const imageQuery = z.strictObject({ v: z.string().regex(/^\d{1,16}$/).optional() });

// A site image covers one camp: up to half a degree (about 55 km) a side is plenty and catches
// corners typed in the wrong order or in the wrong units. Latitudes stop at ±85° where the map's
// projection ends.
const MAX_IMAGE_SPAN_DEG = 0.5;
const corner = (low: number, high: number, name: string) =>
  z.coerce.number({ error: `${name} must be a number of degrees` }).min(low, `${name} must be at least ${low}°`).max(high, `${name} must be at most ${high}°`);
const boundsSchema = z
  .strictObject({ west: corner(-180, 180, 'west'), south: corner(-85, 85, 'south'), east: corner(-180, 180, 'east'), north: corner(-85, 85, 'north') })
  .refine((box) => box.west < box.east, { path: ['east'], message: 'east must be greater than west' })
  .refine((box) => box.south < box.north, { path: ['north'], message: 'north must be greater than south' })
  .refine((box) => box.east - box.west <= MAX_IMAGE_SPAN_DEG && box.north - box.south <= MAX_IMAGE_SPAN_DEG, {
    path: ['east'], message: `A site image may span at most ${MAX_IMAGE_SPAN_DEG}° each way`,
  });

/** The image's bytes are versioned in the URL (`?v=`), so a browser may keep each version for a year. */
const VERSIONED_IMAGE_CACHE = 'private, max-age=31536000, immutable';

/** Multipart upload of one `image` field and the four corner fields, refusals in the API's format. */
function uploadSiteImage(): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: MAX_SITE_IMAGE_BYTES, files: 1, fields: 4, parts: 5 },
    fileFilter: (_request, file, accept) => {
      if ((PHOTO_CONTENT_TYPES as readonly string[]).includes(file.mimetype)) {
        accept(null, true);
      } else {
        accept(new AppError('unsupported_media_type', 'Send a JPEG, PNG or WebP image', { accepted: PHOTO_CONTENT_TYPES }));
      }
    },
  }).single('image');
  return (request, response, next) => {
    upload(request, response, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        next(error.code === 'LIMIT_FILE_SIZE'
          ? new AppError('payload_too_large', `A site image may be at most ${MAX_SITE_IMAGE_BYTES / 1048576} MB`)
          : new AppError('bad_request', `The upload is not valid: ${error.message}`));
        return;
      }
      next(error);
    });
  };
}

/**
 * The review desk: `GET /api/piles/:id/estimate`, `GET /api/review/sites/:siteId[?view=map]`,
 * `PUT|GET /api/sites/:id/image`, `GET /api/sites/:id/image-info` (signed in) and
 * `clientConfigRoutes` (public).
 */
export function reviewRoutes(review: ReviewService, siteImages: SiteImageService): Router {
  const router = Router();

  router.get('/piles/:id/estimate', async (request, response) => {
    const user = currentUser(request);
    const { id } = parseOrThrow(pileParams, request.params, 'pile id');
    parseOrThrow(noQuery, request.query, 'query');
    response.json(await review.estimate(user, id));
  });

  router.get('/review/sites/:siteId', async (request, response) => {
    const user = currentUser(request);
    const { siteId } = parseOrThrow(siteParams, request.params, 'site id');
    const { view } = parseOrThrow(siteReviewQuery, request.query, 'query');
    response.json(view === 'map' ? await review.siteMap(user, siteId) : await review.siteReview(user, siteId));
  });

  router.put('/sites/:id/image', uploadSiteImage(), async (request, response) => {
    const user = currentUser(request);
    const { id } = parseOrThrow(imageSiteParams, request.params, 'site id');
    const bounds = parseOrThrow(boundsSchema, request.body ?? {}, 'image corners');
    response.json(await siteImages.upload(user, id, request.file ?? null, bounds));
  });

  router.get('/sites/:id/image-info', async (request, response) => {
    const user = currentUser(request);
    const { id } = parseOrThrow(imageSiteParams, request.params, 'site id');
    parseOrThrow(noQuery, request.query, 'query');
    response.json(await siteImages.describe(user, id));
  });

  router.get('/sites/:id/image', async (request, response) => {
    const user = currentUser(request);
    const { id } = parseOrThrow(imageSiteParams, request.params, 'site id');
    const { v } = parseOrThrow(imageQuery, request.query, 'query');
    const { image, file } = await siteImages.read(user, id);
    response.setHeader('Cache-Control', v === image.version ? VERSIONED_IMAGE_CACHE : 'private, no-cache');
    response.setHeader('ETag', `"${id}-${image.version}"`);
    response.setHeader('Content-Type', file.contentType);
    response.setHeader('Content-Length', String(file.byteSize));
    file.stream.pipe(response);
  });

  return router;
}

/** What the client needs to know of the deployment before it draws a map. */
export interface ClientConfig {
  /** Tile URL template for online deployments, or null: the map then draws a plain background with a grid. */
  readonly mapTileUrl: string | null;
}

/** `GET /api/client-config`: public, so the map knows its background even before sign-in and offline from cache. */
export function clientConfigRoutes(config: Pick<Config, 'mapTileUrl'>): Router {
  const router = Router();
  router.get('/client-config', (request, response) => {
    parseOrThrow(noQuery, request.query, 'query');
    const answer: ClientConfig = { mapTileUrl: config.mapTileUrl };
    response.json(answer);
  });
  return router;
}
