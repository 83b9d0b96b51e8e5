import { Routes } from '@angular/router';
import { signedInGuard } from '../../core/auth/auth-guards';

export default [
  { path: '', title: 'common.titles.labBatches', loadComponent: () => import('./pages/lab-batches-page/lab-batches-page') },
  { path: 'new', title: 'common.titles.newLabBatch', canActivate: [signedInGuard(['geologist'])], loadComponent: () => import('./pages/new-batch-page/new-batch-page') },
  { path: ':id', title: 'common.titles.labBatch', loadComponent: () => import('./pages/batch-page/batch-page') },
] satisfies Routes;
