import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.samples', loadComponent: () => import('./pages/samples-page/samples-page') },
] satisfies Routes;
