import { Router, type RequestHandler } from 'express';
import type { AppContext } from '../app';
import { captureRoutes } from '../capture/capture.routes';
import { CaptureService } from '../capture/capture.service';
import { ImageJobs } from '../photos/image-jobs';
import type { PhotoStore } from '../photos/photo-store';
import { createPhotoStore } from '../photos/photo-store-factory';
import { photosRoutes } from '../photos/photos.routes';
import { PhotosService } from '../photos/photos.service';
import { syncRoutes } from './sync.routes';
import { SyncService } from './sync.service';

/** The services behind capture and sync, built once per app. */
export interface CaptureSyncServices {
  readonly sync: SyncService;
  readonly capture: CaptureService;
  readonly photos: PhotosService;
  readonly imageJobs: ImageJobs;
}

/** Builds the services; photos go where PHOTO_STORE says (DATA_DIR/photos by default) unless a store is passed. */
export function createCaptureSyncServices(context: AppContext, photoStore?: PhotoStore): CaptureSyncServices {
  const sync = new SyncService(context.database);
  const imageJobs = new ImageJobs();
  const store = photoStore ?? createPhotoStore(context.config);
  return { sync, capture: new CaptureService(sync), photos: new PhotosService(context.database, store, imageJobs, context.logger), imageJobs };
}

/** Every capture, photo and sync route, each behind `authenticate`. Mounted on the API router. */
export function captureSyncRoutes(services: CaptureSyncServices, authenticate: RequestHandler): Router {
  const router = Router();
  router.use(syncRoutes(services.sync, authenticate));
  router.use(captureRoutes(services.capture, authenticate));
  router.use(photosRoutes(services.photos, authenticate));
  return router;
}
