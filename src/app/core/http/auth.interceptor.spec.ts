import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { AuthSession, type SessionUser } from '../auth/auth-session';
import { authInterceptor } from './auth.interceptor';

const user: SessionUser = {
  id: 'u1', organizationId: 'o1', email: 'sampler@demo.heapsight.test', name: 'Neema Field', role: 'sampler', labName: null,
  siteIds: ['s1'], sites: [{ id: 's1', code: 'JR', name: 'Jackal Ridge camp' }], deviceId: 'd1', deviceName: 'Crew phone',
};
const expired = { error: { code: 'token_expired', message: 'Your sign-in has timed out; refresh it', details: null } };

describe('authInterceptor', () => {
  let http: HttpClient;
  let server: HttpTestingController;
  let session: AuthSession;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(withInterceptors([authInterceptor])), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpClient);
    server = TestBed.inject(HttpTestingController);
    session = TestBed.inject(AuthSession);
    session.signIn(user, { accessToken: 'access-1', refreshToken: 'refresh-1' });
  });

  afterEach(() => server.verify());

  it('adds the bearer token to API calls and nothing to other addresses', async () => {
    const api = firstValueFrom(http.get('/api/sites'));
    const other = firstValueFrom(http.get('/assets/tiles.json'));
    const sites = server.expectOne('/api/sites');
    expect(sites.request.headers.get('Authorization')).toBe('Bearer access-1');
    const outside = server.expectOne('/assets/tiles.json');
    expect(outside.request.headers.has('Authorization')).toBe(false);
    sites.flush({ items: [] });
    outside.flush({});
    await Promise.all([api, other]);
  });

  it('refreshes once for several calls that meet an expired token, then repeats each with the new token', async () => {
    // Arrange: two calls go out with the old token.
    const first = firstValueFrom(http.get<{ n: number }>('/api/me'));
    const second = firstValueFrom(http.get<{ n: number }>('/api/sites'));
    server.expectOne('/api/me').flush(expired, { status: 401, statusText: 'Unauthorized' });
    server.expectOne('/api/sites').flush(expired, { status: 401, statusText: 'Unauthorized' });

    // Act: the one refresh answers.
    const refresh = server.expectOne('/api/auth/refresh');
    expect(refresh.request.body).toEqual({ refreshToken: 'refresh-1' });
    refresh.flush({ accessToken: 'access-2', refreshToken: 'refresh-2', user: { ...user, name: 'Neema F.' } });

    // Assert: both calls are repeated with the new token; tokens and profile are stored.
    const retriedMe = server.expectOne('/api/me');
    const retriedSites = server.expectOne('/api/sites');
    expect(retriedMe.request.headers.get('Authorization')).toBe('Bearer access-2');
    expect(retriedSites.request.headers.get('Authorization')).toBe('Bearer access-2');
    retriedMe.flush({ n: 1 });
    retriedSites.flush({ n: 2 });
    expect(await first).toEqual({ n: 1 });
    expect(await second).toEqual({ n: 2 });
    expect(session.refreshToken()).toBe('refresh-2');
    expect(session.user()?.name).toBe('Neema F.');
    expect(session.needsSignIn()).toBe(false);
  });

  it('asks for a new sign-in when the refresh token is refused, keeping the cached profile', async () => {
    const call = firstValueFrom(http.get('/api/me'));
    server.expectOne('/api/me').flush(expired, { status: 401, statusText: 'Unauthorized' });
    server.expectOne('/api/auth/refresh').flush({ error: { code: 'unauthenticated', message: 'Your sign-in has ended; sign in again' } }, { status: 401, statusText: 'Unauthorized' });
    await expect(call).rejects.toMatchObject({ status: 401 });
    expect(session.needsSignIn()).toBe(true);
    expect(session.user()?.email).toBe(user.email);
    expect(JSON.parse(localStorage.getItem('heapsight.needs-sign-in') ?? 'false')).toBe(true);
  });

  it('does not refresh for other refusals', async () => {
    const call = firstValueFrom(http.get('/api/people'));
    server.expectOne('/api/people').flush({ error: { code: 'forbidden', message: 'No' } }, { status: 403, statusText: 'Forbidden' });
    await expect(call).rejects.toMatchObject({ status: 403 });
    server.expectNone('/api/auth/refresh');
  });

  it('sends sign-in calls without a bearer token and never refreshes them', async () => {
    const call = firstValueFrom(http.post('/api/auth/login', {}));
    const login = server.expectOne('/api/auth/login');
    expect(login.request.headers.has('Authorization')).toBe(false);
    login.flush(expired, { status: 401, statusText: 'Unauthorized' });
    await expect(call).rejects.toMatchObject({ status: 401 });
    server.expectNone('/api/auth/refresh');
  });

  it('signing in again clears the request to sign in', () => {
    session.requireSignIn();
    session.signIn(user, { accessToken: 'a', refreshToken: 'r' });
    expect(session.needsSignIn()).toBe(false);
  });
});
