import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Outbox · Heapsight', loadComponent: () => import('./pages/outbox-page/outbox-page') },
] satisfies Routes;
