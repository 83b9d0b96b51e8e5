import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.sampleMass', loadComponent: () => import('./pages/sample-mass-page/sample-mass-page') },
] satisfies Routes;
