import { Router } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { currentUser } from '../accounts/current-user';
import { AppError } from '../lib/errors';
import { parseOrThrow } from '../lib/validate';
import { batchIdParams, createBatchSchema, custodySchema, listBatchesQuery, resultsQuery, siteQuery } from './lab-batch-schemas';
import type { LabService } from './lab.service';
import { MAX_RESULTS_BYTES } from './results-csv';

/** One results file in the multipart field `file`; size refused as 413 in the API's format. */
const uploadResultsFile = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_RESULTS_BYTES, files: 1, fields: 4, parts: 6 } }).single('file');

/** The JSON form of an upload, for scripts: `{fileName, csvText}` (the file's text, UTF-8). */
const jsonUploadSchema = z.strictObject({ fileName: z.string().trim().min(1).max(255), csvText: z.string() });

function jsonUpload(body: unknown): { fileName: string; bytes: Buffer } {
  if (body === undefined || (typeof body === 'object' && body !== null && Object.keys(body).length === 0)) {
    throw new AppError('bad_request', 'Attach the results CSV in the form field "file"');
  }
  const { fileName, csvText } = parseOrThrow(jsonUploadSchema, body, 'results upload');
  return { fileName, bytes: Buffer.from(csvText, 'utf8') };
}

/**
 * `GET /api/reference-standards`, `GET /api/lab-batches/candidates`, `GET|POST /api/lab-batches`,
 * `GET /api/lab-batches/:id`, `PATCH /api/lab-batches/:id/custody`,
 * `GET /api/lab-batches/:id/submission.csv`, `POST /api/lab-batches/:id/send`,
 * `POST /api/lab-batches/:id/results?dryRun=true|false`.
 */
export function labRoutes(lab: LabService): Router {
  const router = Router();

  router.get('/reference-standards', async (request, response) => {
    parseOrThrow(z.strictObject({}), request.query, 'query');
    response.json({ items: await lab.listStandards(currentUser(request)) });
  });

  router.get('/lab-batches/candidates', async (request, response) => {
    const { siteId } = parseOrThrow(siteQuery, request.query, 'query');
    response.json({ items: await lab.listCandidates(currentUser(request), siteId) });
  });

  router.get('/lab-batches', async (request, response) => {
    const filter = parseOrThrow(listBatchesQuery, request.query, 'query');
    response.json({ items: await lab.listBatches(currentUser(request), filter) });
  });

  router.post('/lab-batches', async (request, response) => {
    const input = parseOrThrow(createBatchSchema, request.body, 'lab batch');
    response.status(201).json(await lab.createBatch(currentUser(request), input));
  });

  router.get('/lab-batches/:id', async (request, response) => {
    const { id } = parseOrThrow(batchIdParams, request.params, 'batch id');
    response.json(await lab.getBatch(currentUser(request), id));
  });

  router.patch('/lab-batches/:id/custody', async (request, response) => {
    const { id } = parseOrThrow(batchIdParams, request.params, 'batch id');
    const changes = parseOrThrow(custodySchema, request.body, 'chain of custody');
    response.json(await lab.updateCustody(currentUser(request), id, changes));
  });

  router.get('/lab-batches/:id/submission.csv', async (request, response) => {
    const { id } = parseOrThrow(batchIdParams, request.params, 'batch id');
    const { fileName, csv } = await lab.submissionCsv(currentUser(request), id);
    response.setHeader('Content-Type', 'text/csv; charset=utf-8');
    response.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    response.send(csv);
  });

  router.post('/lab-batches/:id/send', async (request, response) => {
    const { id } = parseOrThrow(batchIdParams, request.params, 'batch id');
    response.json(await lab.sendBatch(currentUser(request), id));
  });

  router.post('/lab-batches/:id/results', async (request, response) => {
    const user = currentUser(request);
    const { id } = parseOrThrow(batchIdParams, request.params, 'batch id');
    const { dryRun } = parseOrThrow(resultsQuery, request.query, 'query');
    // Check access before reading the upload, so a stranger's file is never parsed.
    await lab.loadBatch(user, id, 'lab:results');
    await new Promise<void>((resolve, reject) => {
      uploadResultsFile(request, response, (error: unknown) => {
        if (error instanceof multer.MulterError) {
          reject(error.code === 'LIMIT_FILE_SIZE'
            ? new AppError('payload_too_large', `A results file may be at most ${MAX_RESULTS_BYTES / 1048576} MB; nothing was saved`)
            : new AppError('bad_request', `The upload is not valid: ${error.message}; nothing was saved`));
        } else if (error) {
          reject(error);
        } else {
          resolve();
        }
      });
    });
    const file = request.file
      ? { fileName: request.file.originalname, bytes: request.file.buffer }
      : jsonUpload(request.body);
    response.json(await lab.importResults(user, id, file, dryRun === 'true'));
  });

  return router;
}
