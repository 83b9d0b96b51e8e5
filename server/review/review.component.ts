import { join } from 'node:path';
import type { Router } from 'express';
import type { AppContext } from '../app';
import { ImageJobs } from '../photos/image-jobs';
import { LocalDiskPhotoStore } from '../photos/photo-store';
import { reviewRoutes } from './review.routes';
import { ReviewService } from './review.service';
import { SiteImageService } from './site-image.service';

/** The review desk's routes, built once per app; site images live in DATA_DIR/site-images. */
export function createReviewRoutes(context: AppContext): Router {
  const store = new LocalDiskPhotoStore(join(context.config.dataDir, 'site-images'));
  return reviewRoutes(new ReviewService(), new SiteImageService(context.database, store, new ImageJobs()));
}
