import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Safety · Heapsight', loadComponent: () => import('./pages/safety-page/safety-page') },
] satisfies Routes;
