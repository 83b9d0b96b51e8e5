import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Capture · Heapsight', loadComponent: () => import('./pages/capture-home/capture-home') },
] satisfies Routes;
