import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Labels · Heapsight', loadComponent: () => import('./pages/labels-page/labels-page') },
] satisfies Routes;
