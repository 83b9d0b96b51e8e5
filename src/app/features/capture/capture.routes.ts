import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Capture · Heapsight', loadComponent: () => import('./pages/capture-home/capture-home') },
  { path: 'pile/new', title: 'New pile · Heapsight', loadComponent: () => import('./pages/pile-form/pile-form') },
  { path: 'sample/new', title: 'New sample · Heapsight', loadComponent: () => import('./pages/sample-form/sample-form') },
  { path: 'pan-test/new', title: 'Pan test · Heapsight', loadComponent: () => import('./pages/pan-test-form/pan-test-form') },
] satisfies Routes;
