import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.qaqc', loadComponent: () => import('./pages/qaqc-page/qaqc-page') },
  { path: 'calibration', title: 'common.titles.calibration', loadComponent: () => import('./pages/calibration-page/calibration-page') },
] satisfies Routes;
