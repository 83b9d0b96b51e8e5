import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.labels', loadComponent: () => import('./pages/labels-page/labels-page') },
] satisfies Routes;
