import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.shortlist', loadComponent: () => import('./pages/shortlist-page/shortlist-page') },
] satisfies Routes;
