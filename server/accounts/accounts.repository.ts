import { Op, type Transaction } from 'sequelize';
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

/**
 * Loads the signed-in user fresh for this request, or null when the token no longer stands for a
 * working sign-in: the user is gone or disabled, or the sign-in was ended (signed out, revoked).
 */
export async function loadCurrentUser(userId: string, sessionId: string, deviceId: string | null): Promise<CurrentUser | null> {
  const [user, revoked] = await Promise.all([
    User.findByPk(userId),
    RefreshToken.findOne({ where: { familyId: sessionId, revokedAt: { [Op.ne]: null } }, attributes: ['id'] }),
  ]);
  if (!user || user.isDisabled || !isRole(user.role) || revoked) {
    return null;
  }
  return toCurrentUser(user, await siteIdsOf(user.id), deviceId);
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
  const [sites, device] = await Promise.all([
    Site.findAll({ where: { id: [...user.siteIds] }, order: [['code', 'ASC']], transaction }),
    user.deviceId ? Device.findByPk(user.deviceId, { transaction }) : Promise.resolve(null),
  ]);
  return {
    id: user.id, organizationId: user.organizationId, email: user.email, name: user.name, role: user.role,
    labName: user.labName, siteIds: user.siteIds,
    sites: sites.map((site) => ({ id: site.id, code: site.code, name: site.name })),
    deviceId: user.deviceId, deviceName: device?.name ?? null,
  };
}
