import { Routes } from '@angular/router';

export default [{ path: '', title: 'common.titles.sync', loadComponent: () => import('./pages/sync-page/sync-page') }] satisfies Routes;
