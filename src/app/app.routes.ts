import { Routes } from '@angular/router';

/** Every screen is lazy so the first load carries only the shell. */
export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'capture' },
  { path: 'capture', loadChildren: () => import('./features/capture/capture.routes') },
  { path: 'safety', loadChildren: () => import('./features/safety/safety.routes') },
  { path: '**', loadComponent: () => import('./core/layout/not-found/not-found') },
];
