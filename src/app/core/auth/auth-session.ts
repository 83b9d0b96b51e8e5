import { Injectable, computed, signal } from '@angular/core';
import type { Role } from '../../../../shared/accounts/roles';

/** The signed-in person as the server described them at the last sign-in. */
export interface SessionUser {
  readonly id: string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly siteIds: readonly string[];
}

/** Tokens from the last sign-in or refresh. */
export interface SessionTokens {
  readonly accessToken: string;
  readonly refreshToken: string;
}

const PROFILE_KEY = 'heapsight.profile';
const TOKENS_KEY = 'heapsight.tokens';

/**
 * Who is signed in on this device. The profile is cached so the app opens and captures offline for
 * weeks; an expired token only matters when the device next talks to the server.
 */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  readonly user = signal<SessionUser | null>(readJson<SessionUser>(PROFILE_KEY));
  private readonly tokens = signal<SessionTokens | null>(readJson<SessionTokens>(TOKENS_KEY));
  readonly isSignedIn = computed(() => this.user() !== null);

  accessToken(): string | null {
    return this.tokens()?.accessToken ?? null;
  }

  refreshToken(): string | null {
    return this.tokens()?.refreshToken ?? null;
  }

  /** Stores a fresh sign-in; the profile and tokens survive reloads and offline starts. */
  signIn(user: SessionUser, tokens: SessionTokens): void {
    this.user.set(user);
    this.tokens.set(tokens);
    writeJson(PROFILE_KEY, user);
    writeJson(TOKENS_KEY, tokens);
  }

  /** Replaces the tokens after a refresh, keeping the profile. */
  updateTokens(tokens: SessionTokens): void {
    this.tokens.set(tokens);
    writeJson(TOKENS_KEY, tokens);
  }

  /** Forgets who is signed in on this device (captured records stay in the device database). */
  signOut(): void {
    this.user.set(null);
    this.tokens.set(null);
    localStorage.removeItem(PROFILE_KEY);
    localStorage.removeItem(TOKENS_KEY);
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
