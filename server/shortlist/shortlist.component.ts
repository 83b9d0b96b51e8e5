import { Router } from 'express';
import type { Database } from '../db/database';
import { economicsRoutes } from '../economics/economics.routes';
import { createEconomicsService } from '../economics/economics.service';
import type { MailService } from '../mail/mail.service';
import { createSitesService } from '../sites/sites.service';
import { trialsRoutes } from '../trials/trials.routes';
import { createTrialsService } from '../trials/trials.service';
import { createShortlistService } from './shortlist.service';
import { shortlistRoutes } from './shortlist.routes';

/** Trials, economic parameters and the shortlist, built once per app and mounted behind sign-in. */
export function trialsEconomicsShortlistRoutes({ database, mail }: { database: Database; mail: MailService }): Router {
  const economics = createEconomicsService({ database, sites: createSitesService({ database }) });
  const trials = createTrialsService({ database, economics });
  const router = Router();
  router.use(trialsRoutes(trials));
  router.use(economicsRoutes(economics));
  router.use(shortlistRoutes(createShortlistService({ economics, trials }), mail));
  return router;
}
