import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Piles · Heapsight', loadComponent: () => import('./pages/piles-page/piles-page') },
  { path: ':id', title: 'Pile · Heapsight', loadComponent: () => import('./pages/pile-detail-page/pile-detail-page') },
] satisfies Routes;
