import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Site map · Heapsight', loadComponent: () => import('./pages/site-map-page/site-map-page') },
] satisfies Routes;
