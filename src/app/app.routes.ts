import { Routes } from '@angular/router';
import { signedInGuard } from './core/auth/auth-guards';

/** Every screen is lazy so the first load carries only the shell. */
export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'capture' },
  { path: 'capture', loadChildren: () => import('./features/capture/capture.routes') },
  { path: 'sync', loadChildren: () => import('./features/sync/sync.routes') },
  { path: 'safety', loadChildren: () => import('./features/safety/safety.routes') },
  { path: 'sign-in', loadChildren: () => import('./features/sign-in/sign-in.routes') },
  { path: 'set-password', loadChildren: () => import('./features/sign-in/set-password.routes') },
  { path: 'people', canActivate: [signedInGuard(['admin'])], loadChildren: () => import('./features/people/people.routes') },
  { path: 'outbox', canActivate: [signedInGuard(['admin'])], loadChildren: () => import('./features/outbox/outbox.routes') },
  { path: 'profile', canActivate: [signedInGuard()], loadChildren: () => import('./features/profile/profile.routes') },
  { path: '**', loadComponent: () => import('./core/layout/not-found/not-found') },
];
