import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import type { Role } from '../../../../shared/accounts/roles';
import { AuthSession } from './auth-session';

/**
 * Lets a route open for a signed-in person (from the cached profile, so it works offline), else
 * sends them to sign in and back. With `roles`, only those roles pass; the others go home.
 * The server still decides every request; this only keeps people off screens that would refuse.
 */
export function signedInGuard(roles?: readonly Role[]): CanActivateFn {
  return (_route, state) => {
    const session = inject(AuthSession);
    const router = inject(Router);
    const user = session.user();
    if (!user) {
      return router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
    }
    if (roles && !roles.includes(user.role)) {
      return router.createUrlTree(['/']);
    }
    return true;
  };
}

/** Only for the signed out (the sign-in pages), unless the sign-in must be renewed. */
export const signedOutGuard: CanActivateFn = (route) => {
  const session = inject(AuthSession);
  if (!session.isSignedIn() || session.needsSignIn()) {
    return true;
  }
  return inject(Router).parseUrl(safeReturnUrl(route.queryParamMap.get('returnUrl')));
};

/** A return address inside the app; anything else (another origin, a scheme) becomes home. */
export function safeReturnUrl(value: string | null | undefined): string {
  return value && value.startsWith('/') && !value.startsWith('//') && !value.startsWith('/\\') ? value : '/';
}
