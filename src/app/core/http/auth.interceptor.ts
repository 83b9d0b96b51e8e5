import { HttpBackend, HttpClient, HttpErrorResponse, type HttpInterceptorFn, type HttpRequest } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, catchError, finalize, from, map, shareReplay, switchMap, throwError } from 'rxjs';
import { AuthSession, type SignInResponse } from '../auth/auth-session';

/** Calls that carry their own credentials and must never trigger a refresh. */
const AUTH_PATHS = ['/api/auth/'];

/**
 * One refresh at a time: every request that meets an expired access token waits for the same
 * refresh call, because a refresh token works once and a second parallel refresh would look like
 * theft to the server and end the sign-in.
 */
@Injectable({ providedIn: 'root' })
export class TokenRefresher {
  private readonly session = inject(AuthSession);
  // HttpBackend skips the interceptors, so the refresh call cannot recurse into itself.
  private readonly http = new HttpClient(inject(HttpBackend));
  private inFlight: Observable<string> | null = null;

  /** A fresh access token; on a refused refresh token, marks that a sign-in is needed. */
  refresh(): Observable<string> {
    const refreshToken = this.session.refreshToken();
    if (!refreshToken) {
      this.session.requireSignIn();
      return throwError(() => new HttpErrorResponse({ status: 401, error: { error: { code: 'unauthenticated', message: 'Sign in again' } } }));
    }
    this.inFlight ??= this.http.post<SignInResponse>('/api/auth/refresh', { refreshToken }).pipe(
      catchError((error: unknown) => {
        if (error instanceof HttpErrorResponse && error.status === 401) {
          this.session.requireSignIn();
        }
        return throwError(() => error);
      }),
      map((response) => {
        this.session.updateTokens(response, response.user);
        return response.accessToken;
      }),
      finalize(() => {
        this.inFlight = null;
      }),
      shareReplay({ bufferSize: 1, refCount: false }),
    );
    return this.inFlight;
  }
}

function withBearer(request: HttpRequest<unknown>, token: string | null): HttpRequest<unknown> {
  return token ? request.clone({ setHeaders: { Authorization: `Bearer ${token}` } }) : request;
}

function isTokenExpired(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 401 && (error.error as { error?: { code?: string } } | null)?.error?.code === 'token_expired';
}

/**
 * Adds the bearer token to calls to our own API, and when the server says the access token has
 * expired, refreshes once (shared by all waiting calls) and repeats the call with the new token.
 * Other URLs go out untouched.
 */
export const authInterceptor: HttpInterceptorFn = (request, next) => {
  if (!request.url.startsWith('/api/') || AUTH_PATHS.some((path) => request.url.startsWith(path))) {
    return next(request);
  }
  const session = inject(AuthSession);
  const refresher = inject(TokenRefresher);
  const sentToken = session.accessToken();
  return next(withBearer(request, sentToken)).pipe(
    catchError((error: unknown) => {
      if (!isTokenExpired(error)) {
        return throwError(() => error);
      }
      // Another call may have refreshed while this one was out: use its token rather than rotate again.
      const current = session.accessToken();
      const token$ = current && current !== sentToken ? from([current]) : refresher.refresh();
      return token$.pipe(switchMap((token) => next(withBearer(request, token))));
    }),
  );
};
