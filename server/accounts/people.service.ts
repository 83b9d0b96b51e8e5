import { randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import type { Role } from '../../shared/accounts/roles';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import type { MailService, SentMail } from '../mail/mail.service';
import { Site } from '../sites/site.model';
import { createAccountLink, linkUrl } from './account-links';
import type { CurrentUser } from './current-user';
import { Device } from './device.model';
import { Membership } from './membership.model';
import { assertCan } from './policy';
import { RefreshToken } from './refresh-token.model';
import { User } from './user.model';

/** Where a person's account stands. */
export type PersonStatus = 'invited' | 'active' | 'disabled';

/** A person as `People & sites` lists them. */
export interface Person {
  readonly id: string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly labName: string | null;
  readonly siteIds: readonly string[];
  readonly status: PersonStatus;
  readonly isDisabled: boolean;
  readonly devices: readonly { id: string; name: string; lastSeenAt: string | null; lastSyncAt: string | null }[];
  readonly createdAt: string | null;
}

/** A new person: who, with which role, lab and sites. */
export interface InvitationInput {
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly labName?: string;
  readonly siteIds: readonly string[];
}

/** Changes to a person; absent fields stay as they are. */
export interface PersonChanges {
  readonly name?: string;
  readonly role?: Role;
  readonly labName?: string | null;
  readonly siteIds?: readonly string[];
  readonly isDisabled?: boolean;
}

/** Admin work on people: list, invite, change role and sites, disable. */
export function createPeopleService(dependencies: { database: Database; mail: MailService; publicUrl: string; now?: () => Date }) {
  const { database, mail, publicUrl } = dependencies;
  const now = dependencies.now ?? (() => new Date());

  async function describe(users: User[], transaction?: Transaction): Promise<Person[]> {
    const ids = users.map((user) => user.id);
    const [memberships, devices] = await Promise.all([
      Membership.findAll({ where: { userId: ids }, transaction }),
      Device.findAll({ where: { userId: ids }, order: [['lastSeenAt', 'DESC']], transaction }),
    ]);
    return users.map((user) => ({
      id: user.id, email: user.email, name: user.name, role: user.role, labName: user.labName,
      siteIds: memberships.filter((membership) => membership.userId === user.id).map((membership) => membership.siteId).sort(),
      status: user.isDisabled ? 'disabled' : user.passwordHash ? 'active' : 'invited',
      isDisabled: user.isDisabled,
      devices: devices.filter((device) => device.userId === user.id).map((device) => ({
        id: device.id, name: device.name,
        lastSeenAt: device.lastSeenAt?.toISOString() ?? null, lastSyncAt: device.lastSyncAt?.toISOString() ?? null,
      })),
      createdAt: user.createdAt?.toISOString() ?? null,
    }));
  }

  /** Refuses site ids that are not sites of the admin's organisation. */
  async function assertOwnSites(admin: CurrentUser, siteIds: readonly string[], transaction: Transaction): Promise<void> {
    const unique = [...new Set(siteIds)];
    const found = await Site.count({ where: { id: unique, organizationId: admin.organizationId }, transaction });
    if (found !== unique.length) {
      throw new AppError('validation_failed', 'Some of these sites do not exist', [{ path: 'siteIds', message: 'Unknown site' }]);
    }
  }

  async function replaceMemberships(userId: string, siteIds: readonly string[], transaction: Transaction): Promise<void> {
    const unique = [...new Set(siteIds)];
    await Membership.destroy({ where: { userId, siteId: { [Op.notIn]: unique } }, transaction });
    const existing = await Membership.findAll({ where: { userId }, transaction });
    for (const siteId of unique.filter((id) => !existing.some((membership) => membership.siteId === id))) {
      await Membership.create({ id: randomUUID(), userId, siteId }, { transaction });
    }
  }

  function checkLab(role: Role, labName: string | null | undefined): string | null {
    if (role === 'lab' && !labName) {
      throw new AppError('validation_failed', 'A lab contact needs the name of their laboratory', [{ path: 'labName', message: 'Required for the lab role' }]);
    }
    return role === 'lab' ? (labName ?? null) : null;
  }

  async function sendInvitation(admin: CurrentUser, user: User, token: string): Promise<SentMail> {
    const url = linkUrl(publicUrl, token);
    return mail.sendMail({
      to: user.email,
      organizationId: user.organizationId,
      subject: 'You are invited to Heapsight',
      text: `Hello ${user.name},\n\n${admin.name} has invited you to Heapsight as ${user.role}.\n\nChoose your password here (the link works once, for 7 days):\n${url}\n\nThen sign in with ${user.email} on your phone or computer while it has a connection; after that it works offline.\n`,
      secrets: [url, token],
    });
  }

  async function loadPerson(admin: CurrentUser, id: string, transaction?: Transaction): Promise<User> {
    const user = await User.findOne({ where: { id, organizationId: admin.organizationId }, transaction });
    if (!user) {
      throw new AppError('not_found', 'No such person');
    }
    return user;
  }

  return {
    /** Everyone in the admin's organisation, by name. */
    async list(admin: CurrentUser): Promise<Person[]> {
      assertCan(admin, 'people:manage');
      return describe(await User.findAll({ where: { organizationId: admin.organizationId }, order: [['name', 'ASC']] }));
    },

    /** Creates the person with no password and e-mails them a link to choose one. */
    async invite(admin: CurrentUser, input: InvitationInput): Promise<{ person: Person; mail: SentMail }> {
      assertCan(admin, 'people:manage');
      const labName = checkLab(input.role, input.labName);
      const { user, token } = await database.transaction(async (transaction) => {
        const taken = await User.findOne({ where: { email: input.email }, paranoid: false, transaction });
        if (taken) {
          throw new AppError('conflict', 'Someone with this e-mail address already has an account', { field: 'email' });
        }
        await assertOwnSites(admin, input.siteIds, transaction);
        const created = await User.create(
          { id: randomUUID(), organizationId: admin.organizationId, email: input.email, name: input.name, role: input.role, labName, passwordHash: null, isDisabled: false },
          { transaction },
        );
        await replaceMemberships(created.id, input.siteIds, transaction);
        return { user: created, token: await createAccountLink(created.id, 'invitation', now(), transaction) };
      });
      const sent = await sendInvitation(admin, user, token);
      const [person] = await describe([user]);
      return { person: person as Person, mail: sent };
    },

    /** Sends a new invitation link to someone who has not chosen a password yet. */
    async resendInvitation(admin: CurrentUser, id: string): Promise<{ mail: SentMail }> {
      assertCan(admin, 'people:manage');
      const { user, token } = await database.transaction(async (transaction) => {
        const found = await loadPerson(admin, id, transaction);
        if (found.passwordHash || found.isDisabled) {
          throw new AppError('conflict', 'Only people who have not accepted their invitation can be sent a new one');
        }
        return { user: found, token: await createAccountLink(found.id, 'invitation', now(), transaction) };
      });
      return { mail: await sendInvitation(admin, user, token) };
    },

    /**
     * Changes name, role, lab, sites or the disabled flag. Disabling ends every sign-in of the
     * person at once. Admins cannot demote or disable themselves, so an organisation always keeps
     * the admin who is doing the work.
     */
    async update(admin: CurrentUser, id: string, changes: PersonChanges): Promise<Person> {
      assertCan(admin, 'people:manage');
      return database.transaction(async (transaction) => {
        const user = await loadPerson(admin, id, transaction);
        if (user.id === admin.id && ((changes.role && changes.role !== 'admin') || changes.isDisabled)) {
          throw new AppError('conflict', 'You cannot demote or disable your own account; ask another admin');
        }
        const role = changes.role ?? user.role;
        const labName = checkLab(role, changes.labName === undefined ? user.labName : changes.labName);
        if (changes.siteIds) {
          await assertOwnSites(admin, changes.siteIds, transaction);
          await replaceMemberships(user.id, changes.siteIds, transaction);
        }
        await user.update({ name: changes.name ?? user.name, role, labName, isDisabled: changes.isDisabled ?? user.isDisabled }, { transaction });
        if (changes.isDisabled) {
          await RefreshToken.update({ revokedAt: now() }, { where: { userId: user.id, revokedAt: null }, transaction });
        }
        const [person] = await describe([user], transaction);
        return person as Person;
      });
    },
  };
}

/** The people service as the routes use it. */
export type PeopleService = ReturnType<typeof createPeopleService>;
