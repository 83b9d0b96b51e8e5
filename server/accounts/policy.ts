import type { Role } from '../../shared/accounts/roles';
import { AppError } from '../lib/errors';
import type { CurrentUser } from './current-user';

/**
 * The one answer to "may this user do this to this record" (DESIGN §1). Every route asks here;
 * the client only hides what a role may not do.
 *
 * A permission is granted by role; a scope then narrows it: a site the user must belong to
 * (admins read every site), the owner of a field record (samplers edit only their own), the lab a
 * batch is addressed to (lab users see only their lab's).
 */
export type Permission =
  | 'site:read'
  | 'capture:write'
  | 'capture:resolve-conflict'
  | 'lab:manage'
  | 'lab:results'
  | 'calibration:manage'
  | 'trials:manage'
  | 'economics:manage'
  | 'shortlist:read'
  | 'people:manage'
  | 'sites:manage'
  | 'outbox:read'
  // Review desk: uploading a site's georeferenced background image (admin).
  | 'site-image:manage';

const GRANTS: Record<Role, readonly Permission[]> = {
  sampler: ['site:read', 'capture:write'],
  geologist: ['site:read', 'capture:write', 'capture:resolve-conflict', 'lab:manage', 'lab:results', 'calibration:manage', 'trials:manage', 'shortlist:read'],
  lab: ['lab:results'],
  manager: ['site:read', 'trials:manage', 'economics:manage', 'shortlist:read'],
  // 'site-image:manage' added by the review desk.
  admin: ['site:read', 'shortlist:read', 'people:manage', 'sites:manage', 'outbox:read', 'site-image:manage'],
};

/** What a permission is being asked about. Absent fields are not checked. */
export interface Scope {
  readonly siteId?: string;
  /** The user who created the record; samplers may change only their own. */
  readonly ownerId?: string | null;
  /** The laboratory a batch is addressed to. */
  readonly labName?: string | null;
}

/** True when the user holds the permission for this scope. */
export function can(user: CurrentUser, permission: Permission, scope: Scope = {}): boolean {
  if (!GRANTS[user.role].includes(permission)) {
    return false;
  }
  if (scope.siteId !== undefined && !isSiteReadable(user, scope.siteId)) {
    return false;
  }
  if (permission === 'capture:write' && user.role === 'sampler' && scope.ownerId != null && scope.ownerId !== user.id) {
    return false;
  }
  if (permission === 'lab:results' && user.role === 'lab' && (scope.labName ?? null) !== user.labName) {
    return false;
  }
  return true;
}

/** Throws 403 unless the user holds the permission for this scope. */
export function assertCan(user: CurrentUser, permission: Permission, scope: Scope = {}): void {
  if (!can(user, permission, scope)) {
    throw new AppError('forbidden', 'You do not have permission to do this', { permission });
  }
}

/** The sites whose data the user may read: every site for admins, none for lab users. */
export function readableSiteIds(user: CurrentUser): 'all' | readonly string[] {
  if (user.role === 'admin') {
    return 'all';
  }
  return GRANTS[user.role].includes('site:read') ? user.siteIds : [];
}

/** True when the user may read this site's data. */
export function isSiteReadable(user: CurrentUser, siteId: string): boolean {
  const readable = readableSiteIds(user);
  return readable === 'all' || readable.includes(siteId);
}

/** The roles holding a permission, for documentation and the role × route test. */
export function rolesWith(permission: Permission): Role[] {
  return (Object.keys(GRANTS) as Role[]).filter((role) => GRANTS[role].includes(permission));
}
