import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.trials', loadComponent: () => import('./pages/trials-page/trials-page') },
] satisfies Routes;
