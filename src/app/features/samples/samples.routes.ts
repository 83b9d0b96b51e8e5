import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Samples · Heapsight', loadComponent: () => import('./pages/samples-page/samples-page') },
] satisfies Routes;
