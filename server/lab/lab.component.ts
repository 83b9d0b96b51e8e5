import { Router } from 'express';
import type { Database } from '../db/database';
import { exportsRoutes } from '../exports/exports.routes';
import type { MailService } from '../mail/mail.service';
import { qaqcRoutes } from '../qaqc/qaqc.routes';
import { QaqcService } from '../qaqc/qaqc.service';
import { labRoutes } from './lab.routes';
import { LabService } from './lab.service';

/** Every lab-loop route (batches, results, QA/QC, calibration, exports), for the signed-in router. */
export function labLoopRoutes({ database, mail }: { database: Database; mail: MailService }): Router {
  const router = Router();
  router.use(labRoutes(new LabService(database, mail)));
  router.use(qaqcRoutes(new QaqcService(database)));
  router.use(exportsRoutes());
  return router;
}
