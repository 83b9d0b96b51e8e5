import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { PHOTO_CONTENT_TYPES } from '../../shared/sync/protocol';
import { currentUser } from '../accounts/current-user';
import { AppError } from '../lib/errors';
import { parseOrThrow } from '../lib/validate';
import { MAX_PHOTO_BYTES, type PhotosService } from './photos.service';

const photoIdSchema = z.object({ uuid: z.uuid() });
const readQuerySchema = z.object({ size: z.enum(['thumb', 'full']).default('full') }).strict();
const listQuerySchema = z.object({ ownerEntity: z.enum(['pile', 'sample']).optional(), ownerId: z.uuid().optional() }).strict();

/** A photo's bytes never change once stored, so a browser may keep them for a year. */
const STORED_PHOTO_CACHE = 'private, max-age=31536000, immutable';

/** Multipart upload of one `photo` field, with size and type refused as 413/415 in the API's format. */
function uploadOnePhoto(): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 4, parts: 6 },
    fileFilter: (_request, file, accept) => {
      if ((PHOTO_CONTENT_TYPES as readonly string[]).includes(file.mimetype)) {
        accept(null, true);
      } else {
        accept(new AppError('unsupported_media_type', 'Send a JPEG, PNG or WebP image', { accepted: PHOTO_CONTENT_TYPES }));
      }
    },
  }).single('photo');
  return (request, response, next) => {
    upload(request, response, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        next(error.code === 'LIMIT_FILE_SIZE'
          ? new AppError('payload_too_large', `A photo may be at most ${MAX_PHOTO_BYTES / 1048576} MB`)
          : new AppError('bad_request', `The upload is not valid: ${error.message}`));
        return;
      }
      next(error);
    });
  };
}

/** `PUT|GET /api/photos/:uuid` and `GET /api/photos`. */
export function photosRoutes(photos: PhotosService, authenticate: RequestHandler): Router {
  const router = Router();

  router.get('/photos', authenticate, async (request, response) => {
    const filter = parseOrThrow(listQuerySchema, request.query, 'query');
    response.json({ items: await photos.list(currentUser(request), filter) });
  });

  router.put('/photos/:uuid', authenticate, uploadOnePhoto(), async (request, response) => {
    const { uuid } = parseOrThrow(photoIdSchema, request.params, 'photo id');
    // No file is fine for a photo already stored: the PUT is idempotent and answers its record.
    response.json(await photos.upload(currentUser(request), uuid, request.file ?? null));
  });

  router.get('/photos/:uuid', authenticate, async (request, response) => {
    const { uuid } = parseOrThrow(photoIdSchema, request.params, 'photo id');
    const { size } = parseOrThrow(readQuerySchema, request.query, 'query');
    const { file, size: served } = await photos.read(currentUser(request), uuid, size);
    const etag = `"${uuid}-${served}-${file.byteSize}"`;
    // A thumbnail still being made is answered with the full image, which must not be cached as the thumbnail.
    response.setHeader('Cache-Control', served === size ? STORED_PHOTO_CACHE : 'private, no-cache');
    response.setHeader('ETag', etag);
    response.setHeader('X-Photo-Size', served);
    if (request.headers['if-none-match'] === etag) {
      file.stream.destroy();
      response.status(304).end();
      return;
    }
    response.setHeader('Content-Type', file.contentType);
    response.setHeader('Content-Length', String(file.byteSize));
    file.stream.pipe(response);
  });

  return router;
}
