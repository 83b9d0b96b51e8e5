import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Shortlist · Heapsight', loadComponent: () => import('./pages/shortlist-page/shortlist-page') },
] satisfies Routes;
