import { Routes } from '@angular/router';

export default [
  { path: '', title: 'common.titles.profile', loadComponent: () => import('./pages/profile-page/profile-page') },
] satisfies Routes;
