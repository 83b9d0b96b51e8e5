import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { AuthSession, type SessionUser, type SignInResponse } from './auth-session';

/** Who an e-mailed password link is for. */
export interface LinkInfo {
  readonly purpose: 'invitation' | 'password-reset';
  readonly email: string;
  readonly name: string;
  readonly expiresAt: string;
}

/** The sign-in calls to the server; results land in AuthSession. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);
  private readonly session = inject(AuthSession);

  /** Signs in with this device's id and name, and stores the session. */
  async signIn(email: string, password: string, deviceName: string | null): Promise<SessionUser> {
    const device = this.session.device();
    const name = deviceName?.trim() || device.name;
    const body = { email, password, deviceId: device.id, ...(name ? { deviceName: name } : {}) };
    const response = await firstValueFrom(this.http.post<SignInResponse>('/api/auth/login', body));
    this.session.signIn(response.user, response);
    return response.user;
  }

  /** Ends the sign-in on the server (when reachable) and forgets it here in any case. */
  async signOut(): Promise<void> {
    const refreshToken = this.session.refreshToken();
    this.session.signOut();
    if (refreshToken) {
      await firstValueFrom(this.http.post('/api/auth/logout', { refreshToken })).catch(() => undefined);
    }
  }

  /** Fetches the profile again and caches it; offline, the cached one stays. */
  async reloadProfile(): Promise<SessionUser | null> {
    const user = await firstValueFrom(this.http.get<SessionUser>('/api/me'));
    this.session.updateProfile(user);
    return user;
  }

  /** Renames this device on the server and here. */
  async renameDevice(name: string): Promise<SessionUser> {
    const user = await firstValueFrom(this.http.patch<SessionUser>('/api/me/device', { name }));
    this.session.updateProfile(user);
    this.session.nameDevice(name);
    return user;
  }

  requestPasswordReset(email: string): Promise<{ message: string }> {
    return firstValueFrom(this.http.post<{ message: string }>('/api/auth/password-reset', { email }));
  }

  describeLink(token: string): Promise<LinkInfo> {
    return firstValueFrom(this.http.post<LinkInfo>('/api/auth/link', { token }));
  }

  setPassword(token: string, password: string): Promise<{ email: string }> {
    return firstValueFrom(this.http.post<{ email: string }>('/api/auth/password', { token, password }));
  }
}
