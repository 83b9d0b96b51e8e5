import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.siteMap', loadComponent: () => import('./pages/site-map-page/site-map-page') },
] satisfies Routes;
