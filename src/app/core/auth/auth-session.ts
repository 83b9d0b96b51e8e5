import { Injectable, computed, signal } from '@angular/core';
import type { Role } from '../../../../shared/accounts/roles';

/** The signed-in person as the server described them at the last sign-in or refresh. */
export interface SessionUser {
  readonly id: string;
  readonly organizationId: string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly labName: string | null;
  readonly siteIds: readonly string[];
  readonly sites: readonly { readonly id: string; readonly code: string; readonly name: string }[];
  readonly deviceId: string | null;
  readonly deviceName: string | null;
}

/** Tokens from the last sign-in or refresh. */
export interface SessionTokens {
  readonly accessToken: string;
  readonly refreshToken: string;
}

/** What the server answers to a sign-in or a refresh. */
export interface SignInResponse extends SessionTokens {
  readonly user: SessionUser;
}

const PROFILE_KEY = 'heapsight.profile';
const TOKENS_KEY = 'heapsight.tokens';
const DEVICE_KEY = 'heapsight.device';
const NEEDS_SIGN_IN_KEY = 'heapsight.needs-sign-in';

/** This device's own id (made here once, sent with every sign-in) and the name people gave it. */
export interface DeviceIdentity {
  readonly id: string;
  readonly name: string | null;
}

/**
 * Who is signed in on this device. The profile is cached so the app opens and captures offline for
 * weeks; an expired token only matters when the device next talks to the server. When the refresh
 * token is refused, `needsSignIn` turns true: the profile stays (the app keeps working, nothing
 * queued is dropped) until the person signs in again.
 */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  readonly user = signal<SessionUser | null>(readJson<SessionUser>(PROFILE_KEY));
  private readonly tokens = signal<SessionTokens | null>(readJson<SessionTokens>(TOKENS_KEY));
  readonly isSignedIn = computed(() => this.user() !== null);
  /** True when the server refused the refresh token: sync must wait for a new sign-in. */
  readonly needsSignIn = signal<boolean>(readJson<boolean>(NEEDS_SIGN_IN_KEY) === true);
  readonly role = computed(() => this.user()?.role ?? null);

  accessToken(): string | null {
    return this.tokens()?.accessToken ?? null;
  }

  refreshToken(): string | null {
    return this.tokens()?.refreshToken ?? null;
  }

  /** This device's id, made once and kept across sign-ins, and its name. */
  device(): DeviceIdentity {
    const stored = readJson<DeviceIdentity>(DEVICE_KEY);
    if (stored?.id) {
      return stored;
    }
    const made: DeviceIdentity = { id: crypto.randomUUID(), name: null };
    writeJson(DEVICE_KEY, made);
    return made;
  }

  /** Remembers the name of this device for the next sign-in. */
  nameDevice(name: string): void {
    writeJson(DEVICE_KEY, { ...this.device(), name });
  }

  /** Stores a fresh sign-in; the profile and tokens survive reloads and offline starts. */
  signIn(user: SessionUser, tokens: SessionTokens): void {
    this.user.set(user);
    this.tokens.set(tokens);
    writeJson(PROFILE_KEY, user);
    writeJson(TOKENS_KEY, tokens);
    if (user.deviceName) {
      this.nameDevice(user.deviceName);
    }
    this.setNeedsSignIn(false);
  }

  /** Replaces the tokens (and the profile, which the server sends again) after a refresh. */
  updateTokens(tokens: SessionTokens, user?: SessionUser): void {
    this.tokens.set(tokens);
    writeJson(TOKENS_KEY, { accessToken: tokens.accessToken, refreshToken: tokens.refreshToken });
    if (user) {
      this.updateProfile(user);
    }
  }

  /** Replaces the cached profile, e.g. after `GET /api/me`. */
  updateProfile(user: SessionUser): void {
    this.user.set(user);
    writeJson(PROFILE_KEY, user);
  }

  /** The server refused the refresh token: keep the profile (work goes on), ask for a sign-in. */
  requireSignIn(): void {
    this.setNeedsSignIn(true);
  }

  /** Forgets who is signed in on this device (captured records stay in the device database). */
  signOut(): void {
    this.user.set(null);
    this.tokens.set(null);
    localStorage.removeItem(PROFILE_KEY);
    localStorage.removeItem(TOKENS_KEY);
    this.setNeedsSignIn(false);
  }

  private setNeedsSignIn(value: boolean): void {
    this.needsSignIn.set(value);
    if (value) {
      writeJson(NEEDS_SIGN_IN_KEY, true);
    } else {
      localStorage.removeItem(NEEDS_SIGN_IN_KEY);
    }
  }
}

function readJson<T>(key: string): T | null {
  try {
    const raw = localStorage.getItem(key);
    return raw ? (JSON.parse(raw) as T) : null;
  } catch {
    return null;
  }
}

function writeJson(key: string, value: unknown): void {
  localStorage.setItem(key, JSON.stringify(value));
}
