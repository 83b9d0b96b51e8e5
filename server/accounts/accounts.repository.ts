import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { isRole } from '../../shared/accounts/roles';
import { Site } from '../sites/site.model';
import type { CurrentUser } from './current-user';
import { Device } from './device.model';
import { Membership } from './membership.model';
import { RefreshToken } from './refresh-token.model';
import { User } from './user.model';

/** The ids of the sites a user is a member of. */
export async function siteIdsOf(userId: string, transaction?: Transaction): Promise<string[]> {
  const memberships = await Membership.findAll({ where: { userId }, attributes: ['siteId'], transaction });
  return memberships.map((membership) => membership.siteId).sort();
}

/** The shape of a UUID as our ids and sign-in ids are written; anything else cannot name a row. */
const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** One row of {@link CURRENT_USER_SQL}: the user's columns, repeated once per membership. */
interface CurrentUserRow {
  readonly id: string;
  readonly organizationId: string;
  readonly email: string;
  readonly name: string;
  readonly role: string;
  readonly labName: string | null;
  /** SQLite answers 0 or 1, PostgreSQL false or true. */
  readonly isDisabled: boolean | number;
  /** 1 when any token of this sign-in's family has been revoked, else 0. */
  readonly isRevoked: number | string;
  /** Null when the user belongs to no site (the LEFT JOIN's one row). */
  readonly siteId: string | null;
}

/**
 * Everything a request needs about its sign-in in one round trip, read fresh every time: the live
 * (not deleted) user, whether the sign-in's refresh-token family was revoked (signed out, theft,
 * disabled), and one row per membership. Portable SQL (quoted camelCase names, CASE WHEN EXISTS
 * so both dialects answer an integer); served by the primary key of users and the indexes on
 * refresh_tokens(familyId) and memberships(userId, siteId).
 */
const CURRENT_USER_SQL = `SELECT u."id", u."organizationId", u."email", u."name", u."role", u."labName", u."isDisabled",
  CASE WHEN EXISTS (SELECT 1 FROM "refresh_tokens" r WHERE r."familyId" = :sessionId AND r."revokedAt" IS NOT NULL) THEN 1 ELSE 0 END AS "isRevoked",
  m."siteId"
FROM "users" u LEFT JOIN "memberships" m ON m."userId" = u."id"
WHERE u."id" = :userId AND u."deletedAt" IS NULL`;

/**
 * Loads the signed-in user fresh for this request, or null when the token no longer stands for a
 * working sign-in: the user is gone or disabled, or the sign-in was ended (signed out, revoked).
 * One raw query (no model instances): a disabled user, a changed role, a removed membership or a
 * revoked family takes effect on the very next request, whichever process wrote it.
 */
export async function loadCurrentUser(userId: string, sessionId: string, deviceId: string | null): Promise<CurrentUser | null> {
  if (!UUID_PATTERN.test(userId) || !UUID_PATTERN.test(sessionId)) {
    return null;
  }
  const sequelize = User.sequelize as Sequelize;
  const rows = await sequelize.query<CurrentUserRow>(CURRENT_USER_SQL, { type: QueryTypes.SELECT, replacements: { userId, sessionId } });
  const [user] = rows;
  if (!user || Number(user.isDisabled) !== 0 || Number(user.isRevoked) !== 0 || !isRole(user.role)) {
    return null;
  }
  const siteIds = rows.flatMap((row) => (row.siteId === null ? [] : [row.siteId])).sort();
  return {
    id: user.id, organizationId: user.organizationId, email: user.email, name: user.name, role: user.role,
    labName: user.labName, siteIds, deviceId,
  };
}

/** The request's view of a user row. */
export function toCurrentUser(user: User, siteIds: readonly string[], deviceId: string | null): CurrentUser {
  return {
    id: user.id, organizationId: user.organizationId, email: user.email, name: user.name, role: user.role,
    labName: user.labName, siteIds, deviceId,
  };
}

/** What the client caches about the signed-in person: enough to open and capture offline. */
export interface Profile {
  readonly id: string;
  readonly organizationId: string;
  readonly email: string;
  readonly name: string;
  readonly role: CurrentUser['role'];
  readonly labName: string | null;
  readonly siteIds: readonly string[];
  readonly sites: readonly { id: string; code: string; name: string }[];
  readonly deviceId: string | null;
  readonly deviceName: string | null;
}

/** The profile of a user as of now, with their sites' codes and names and this device's name. */
export async function loadProfile(user: CurrentUser, transaction?: Transaction): Promise<Profile> {
  // Plain rows of the few columns shown (no model instances): this runs on every GET /api/me.
  const [sites, device] = await Promise.all([
    user.siteIds.length === 0
      ? Promise.resolve([])
      : Site.findAll({ where: { id: [...user.siteIds] }, attributes: ['id', 'code', 'name'], order: [['code', 'ASC']], raw: true, transaction }),
    user.deviceId ? Device.findByPk(user.deviceId, { attributes: ['name'], raw: true, transaction }) : Promise.resolve(null),
  ]);
  return {
    id: user.id, organizationId: user.organizationId, email: user.email, name: user.name, role: user.role,
    labName: user.labName, siteIds: user.siteIds,
    sites: sites.map((site) => ({ id: site.id, code: site.code, name: site.name })),
    deviceId: user.deviceId, deviceName: device?.name ?? null,
  };
}
