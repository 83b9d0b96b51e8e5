import type { Request } from 'express';
import type { Role } from '../../shared/accounts/roles';
import { AppError } from '../lib/errors';

/**
 * The signed-in user as every route and service sees them, loaded fresh from the database on each
 * request by the authentication middleware (so a disabled user or a removed membership takes
 * effect at once, not when the token expires).
 */
export interface CurrentUser {
  readonly id: string;
  readonly organizationId: string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  /** For lab users: the laboratory whose batches they may see. */
  readonly labName: string | null;
  /** Sites the user is a member of. */
  readonly siteIds: readonly string[];
  /** The device the token was issued to, when the client named one. */
  readonly deviceId: string | null;
}

/** The authenticated user of this request; 401 when the request carries no valid sign-in. */
export function currentUser(request: Request): CurrentUser {
  const user = request.user as CurrentUser | undefined;
  if (!user) {
    throw new AppError('unauthenticated', 'Sign in to continue');
  }
  return user;
}
