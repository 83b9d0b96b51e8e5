import { TestBed } from '@angular/core/testing';
import { Router, provideRouter, type ActivatedRouteSnapshot, type RouterStateSnapshot, type UrlTree } from '@angular/router';
import { AuthSession, type SessionUser } from './auth-session';
import { safeReturnUrl, signedInGuard } from './auth-guards';

const admin: SessionUser = {
  id: 'a', organizationId: 'o', email: 'admin@x.test', name: 'Admin', role: 'admin', labName: null, siteIds: [], sites: [], deviceId: null, deviceName: null,
};

function run(guard: ReturnType<typeof signedInGuard>, url: string): boolean | UrlTree {
  return TestBed.runInInjectionContext(() => guard({} as ActivatedRouteSnapshot, { url } as RouterStateSnapshot)) as boolean | UrlTree;
}

describe('signedInGuard', () => {
  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ providers: [provideRouter([])] });
  });

  it('sends a signed-out visitor to sign in, with the way back', () => {
    const result = run(signedInGuard(), '/profile');
    expect(TestBed.inject(Router).serializeUrl(result as UrlTree)).toBe('/sign-in?returnUrl=%2Fprofile');
  });

  it('lets the cached profile in with no network, and keeps other roles off admin screens', () => {
    TestBed.inject(AuthSession).signIn(admin, { accessToken: 'a', refreshToken: 'r' });
    expect(run(signedInGuard(['admin']), '/people')).toBe(true);
    TestBed.inject(AuthSession).signIn({ ...admin, role: 'sampler' }, { accessToken: 'a', refreshToken: 'r' });
    expect(TestBed.inject(Router).serializeUrl(run(signedInGuard(['admin']), '/people') as UrlTree)).toBe('/');
  });
});

describe('safeReturnUrl', () => {
  it('follows only addresses inside the app', () => {
    expect(safeReturnUrl('/people?tab=1')).toBe('/people?tab=1');
    expect(safeReturnUrl('https://elsewhere.test/')).toBe('/');
    expect(safeReturnUrl('//elsewhere.test')).toBe('/');
    expect(safeReturnUrl('/\\elsewhere.test')).toBe('/');
    expect(safeReturnUrl(undefined)).toBe('/');
  });
});
