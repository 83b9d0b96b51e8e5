import type { Router } from 'express';
import type { Database } from '../db/database';
import { SyncService } from '../sync/sync.service';
import { labelsRoutes } from './labels.routes';
import { LabelsService } from './labels.service';

/** The label-sheet routes, with their service built once per app. */
export function labelRoutes(database: Database): Router {
  return labelsRoutes(new LabelsService(database, new SyncService(database)));
}
