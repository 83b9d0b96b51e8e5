import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.people', loadComponent: () => import('./pages/people-page/people-page') },
] satisfies Routes;
