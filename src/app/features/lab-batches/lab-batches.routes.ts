import { Routes } from '@angular/router';
import { signedInGuard } from '../../core/auth/auth-guards';

export default [
  { path: '', title: 'Lab batches · Heapsight', loadComponent: () => import('./pages/lab-batches-page/lab-batches-page') },
  { path: 'new', title: 'New lab batch · Heapsight', canActivate: [signedInGuard(['geologist'])], loadComponent: () => import('./pages/new-batch-page/new-batch-page') },
  { path: ':id', title: 'Lab batch · Heapsight', loadComponent: () => import('./pages/batch-page/batch-page') },
] satisfies Routes;
