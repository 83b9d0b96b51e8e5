import { Routes } from '@angular/router';

export default [
  { path: '', title: 'Profile · Heapsight', loadComponent: () => import('./pages/profile-page/profile-page') },
] satisfies Routes;
