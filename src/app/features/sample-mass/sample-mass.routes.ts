import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Sample mass · Heapsight', loadComponent: () => import('./pages/sample-mass-page/sample-mass-page') },
] satisfies Routes;
