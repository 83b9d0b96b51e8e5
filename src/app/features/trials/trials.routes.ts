import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Trials · Heapsight', loadComponent: () => import('./pages/trials-page/trials-page') },
] satisfies Routes;
