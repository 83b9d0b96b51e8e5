import { Routes } from '@angular/router';

export default [{ path: '', title: 'Sync · Heapsight', loadComponent: () => import('./pages/sync-page/sync-page') }] satisfies Routes;
