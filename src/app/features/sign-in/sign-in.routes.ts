import { Routes } from '@angular/router';
import { signedOutGuard } from '../../core/auth/auth-guards';

export default [
  { path: '', title: 'Sign in · Heapsight', canActivate: [signedOutGuard], loadComponent: () => import('./pages/sign-in-page/sign-in-page') },
  { path: 'forgot', title: 'Forgot password · Heapsight', loadComponent: () => import('./pages/forgot-password-page/forgot-password-page') },
] satisfies Routes;
