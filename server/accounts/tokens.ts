import jwt from 'jsonwebtoken';
import { createHash, randomBytes } from 'node:crypto';

/**
 * Token shapes and lifetimes. Access tokens are short JWTs (HS256 only, issuer and audience
 * checked) so a stolen one is worth little; refresh tokens are opaque random strings, stored
 * hashed, rotated on every use, and long enough to cover weeks in the field.
 */
export const ACCESS_TOKEN_TTL_SECONDS = 15 * 60;
/** 30 days: a crew can stay out a month and still sync without signing in again. */
export const REFRESH_TOKEN_TTL_MS = 30 * 24 * 60 * 60 * 1000;
export const TOKEN_ISSUER = 'heapsight';
export const TOKEN_AUDIENCE = 'heapsight-api';
/** The only signing algorithm accepted; `none` and asymmetric algorithms are refused. */
export const TOKEN_ALGORITHM = 'HS256' as const;

/** What an access token says beyond its subject (the user id). */
export interface AccessClaims {
  readonly userId: string;
  /** The sign-in (refresh-token family) it belongs to, so signing out ends it at once. */
  readonly sessionId: string;
  readonly deviceId: string | null;
}

/** The JWT payload as signed: `sub` is the user, `sid` the sign-in, `did` the device. */
export interface AccessPayload {
  readonly sub: string;
  readonly sid: string;
  readonly did: string | null;
}

/** Signs a short-lived access token. */
export function signAccessToken(secret: string, claims: AccessClaims): string {
  return jwt.sign({ sid: claims.sessionId, did: claims.deviceId }, secret, {
    algorithm: TOKEN_ALGORITHM,
    expiresIn: ACCESS_TOKEN_TTL_SECONDS,
    issuer: TOKEN_ISSUER,
    audience: TOKEN_AUDIENCE,
    subject: claims.userId,
  });
}

/** A new opaque token: 32 random bytes, URL-safe (refresh tokens and e-mailed links). */
export function newOpaqueToken(): string {
  return randomBytes(32).toString('base64url');
}

/** The hash stored in place of an opaque token; SHA-256 suffices for 256 random bits. */
export function hashOpaqueToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
