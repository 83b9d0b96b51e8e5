import { Routes } from '@angular/router';

export default [
  { path: '', title: 'QA/QC · Heapsight', loadComponent: () => import('./pages/qaqc-page/qaqc-page') },
  { path: 'calibration', title: 'Calibration · Heapsight', loadComponent: () => import('./pages/calibration-page/calibration-page') },
] satisfies Routes;
