import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.piles', loadComponent: () => import('./pages/piles-page/piles-page') },
  { path: ':id', title: 'common.titles.pile', loadComponent: () => import('./pages/pile-detail-page/pile-detail-page') },
] satisfies Routes;
