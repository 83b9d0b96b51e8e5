import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.capture', loadComponent: () => import('./pages/capture-home/capture-home') },
  { path: 'pile/new', title: 'common.titles.newPile', loadComponent: () => import('./pages/pile-form/pile-form') },
  { path: 'sample/new', title: 'common.titles.newSample', loadComponent: () => import('./pages/sample-form/sample-form') },
  { path: 'pan-test/new', title: 'common.titles.panTest', loadComponent: () => import('./pages/pan-test-form/pan-test-form') },
] satisfies Routes;
