import { Routes } from '@angular/router';

/** The page e-mailed links open (`/set-password?token=…`), for invitations and resets alike. */
export default [
  { path: '', title: 'common.titles.setPassword', loadComponent: () => import('./pages/set-password-page/set-password-page') },
] satisfies Routes;
