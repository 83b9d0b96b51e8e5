import { Routes } from '@angular/router';
import { signedInGuard } from './core/auth/auth-guards';

/** Every screen is lazy so the first load carries only the shell. */
export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'capture' },
  { path: 'capture', loadChildren: () => import('./features/capture/capture.routes') },
  { path: 'sync', loadChildren: () => import('./features/sync/sync.routes') },
  { path: 'safety', loadChildren: () => import('./features/safety/safety.routes') },
  { path: 'site-map', canActivate: [signedInGuard(['sampler', 'geologist', 'manager', 'admin'])], loadChildren: () => import('./features/site-map/site-map.routes') },
  { path: 'piles', canActivate: [signedInGuard(['sampler', 'geologist', 'manager', 'admin'])], loadChildren: () => import('./features/piles/piles.routes') },
  { path: 'samples', canActivate: [signedInGuard(['sampler', 'geologist', 'manager', 'admin'])], loadChildren: () => import('./features/samples/samples.routes') },
  { path: 'sample-mass', canActivate: [signedInGuard(['sampler', 'geologist', 'manager', 'admin'])], loadChildren: () => import('./features/sample-mass/sample-mass.routes') },
  { path: 'labels', canActivate: [signedInGuard(['sampler', 'geologist'])], loadChildren: () => import('./features/labels/labels.routes') },
  { path: 'lab-batches', canActivate: [signedInGuard(['geologist', 'lab'])], loadChildren: () => import('./features/lab-batches/lab-batches.routes') },
  { path: 'qaqc', canActivate: [signedInGuard(['geologist'])], loadChildren: () => import('./features/qaqc/qaqc.routes') },
  { path: 'trials', canActivate: [signedInGuard(['manager', 'geologist'])], loadChildren: () => import('./features/trials/trials.routes') },
  { path: 'shortlist', canActivate: [signedInGuard(['manager', 'admin'])], loadChildren: () => import('./features/shortlist/shortlist.routes') },
  { path: 'sign-in', loadChildren: () => import('./features/sign-in/sign-in.routes') },
  { path: 'set-password', loadChildren: () => import('./features/sign-in/set-password.routes') },
  { path: 'people', canActivate: [signedInGuard(['admin'])], loadChildren: () => import('./features/people/people.routes') },
  { path: 'outbox', canActivate: [signedInGuard(['admin'])], loadChildren: () => import('./features/outbox/outbox.routes') },
  { path: 'profile', canActivate: [signedInGuard()], loadChildren: () => import('./features/profile/profile.routes') },
  { path: '**', title: 'common.titles.notFound', loadComponent: () => import('./core/layout/not-found/not-found') },
];
