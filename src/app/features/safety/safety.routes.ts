import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.safety', loadComponent: () => import('./pages/safety-page/safety-page') },
] satisfies Routes;
