import { Routes } from '@angular/router';
import { signedOutGuard } from '../../core/auth/auth-guards';

export default [
  { path: '', title: 'common.titles.signIn', canActivate: [signedOutGuard], loadComponent: () => import('./pages/sign-in-page/sign-in-page') },
  { path: 'forgot', title: 'common.titles.forgotPassword', loadComponent: () => import('./pages/forgot-password-page/forgot-password-page') },
] satisfies Routes;
