import { Router } from 'express';
import { z } from 'zod';
import { currentUser } from '../accounts/current-user';
import { parseOrThrow } from '../lib/validate';
import { labelSheetPdf } from './label-sheet';
import { MAX_LABELS_PER_REQUEST, type LabelsService } from './labels.service';

/** `?site=<id>&count=N`: which site's codes, and how many labels to print. */
const labelsQuerySchema = z.strictObject({
  site: z.uuid('name the site by its id: ?site=…'),
  count: z.coerce.number('count is a whole number of labels').int('count is a whole number of labels')
    .min(1, 'print at least one label').max(MAX_LABELS_PER_REQUEST, `print at most ${MAX_LABELS_PER_REQUEST} labels at a time`),
});

/** `GET /api/labels.pdf?site=…&count=N`: a sheet of new, never-repeated sample labels. */
export function labelsRoutes(labels: LabelsService): Router {
  const router = Router();
  router.get('/labels.pdf', async (request, response) => {
    const { site, count } = parseOrThrow(labelsQuerySchema, request.query, 'label request');
    const reserved = await labels.reserve(currentUser(request), site, count);
    const pdf = await labelSheetPdf(reserved);
    const first = reserved.codes[0];
    const last = reserved.codes[reserved.codes.length - 1];
    response.setHeader('Content-Type', 'application/pdf');
    response.setHeader('Content-Disposition', `attachment; filename="heapsight-labels-${first}-to-${last}.pdf"`);
    response.setHeader('Cache-Control', 'no-store');
    response.setHeader('X-Label-Codes', `${first}..${last}`);
    response.send(pdf);
  });
  return router;
}
