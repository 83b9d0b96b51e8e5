import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.outbox', loadComponent: () => import('./pages/outbox-page/outbox-page') },
] satisfies Routes;
