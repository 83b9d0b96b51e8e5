import { Routes } from '@angular/router';

export default [
  { path: '', title: 'People & sites · Heapsight', loadComponent: () => import('./pages/people-page/people-page') },
] satisfies Routes;
