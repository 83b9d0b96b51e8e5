import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import type { Database } from '../db/database';
import { AppError } from '../lib/errors';
import type { MailService } from '../mail/mail.service';
import type { LoginInput } from './account-schemas';
import { createAccountLink, findUsableLink, linkUrl } from './account-links';
import { loadProfile, siteIdsOf, toCurrentUser, type Profile } from './accounts.repository';
import { Device } from './device.model';
import { RefreshToken } from './refresh-token.model';
import { User } from './user.model';
import { REFRESH_TOKEN_TTL_MS, hashOpaqueToken, newOpaqueToken, signAccessToken } from './tokens';

/** bcrypt cost: 10 is the library default and OWASP's floor, about 70 ms on the 2-core server. */
export const PASSWORD_HASH_ROUNDS = 10;

/** What a sign-in or refresh answers. */
export interface SignInResult {
  readonly accessToken: string;
  readonly refreshToken: string;
  readonly user: Profile;
}

/** The same words for an unknown e-mail, a wrong password and a disabled account. */
const WRONG_CREDENTIALS = 'E-mail or password is wrong';
const SIGN_IN_AGAIN = 'Your sign-in has ended; sign in again';

/** Everything sign-in needs from the outside. `now` is passed in so tests can move the clock. */
export interface AuthDependencies {
  readonly database: Database;
  readonly jwtSecret: string;
  readonly mail: MailService;
  readonly publicUrl: string;
  readonly now?: () => Date;
}

let dummyHash: Promise<string> | null = null;
/** A hash to compare against when the e-mail is unknown, so both cases take the same time. */
function timingDummyHash(): Promise<string> {
  dummyHash ??= bcrypt.hash('no account has this password', PASSWORD_HASH_ROUNDS);
  return dummyHash;
}

/** Sign-in, refresh rotation, sign-out and the e-mailed password links. */
export function createAuthService(dependencies: AuthDependencies) {
  const { database, jwtSecret, mail, publicUrl } = dependencies;
  const now = dependencies.now ?? (() => new Date());

  /** Starts a new sign-in family for the user on the device, and answers its first tokens. */
  async function startSession(user: User, deviceId: string | null, at: Date, transaction: Transaction): Promise<SignInResult> {
    const familyId = randomUUID();
    const refreshToken = newOpaqueToken();
    await RefreshToken.create(
      {
        id: randomUUID(), familyId, userId: user.id, deviceId, tokenHash: hashOpaqueToken(refreshToken),
        expiresAt: new Date(at.getTime() + REFRESH_TOKEN_TTL_MS), rotatedAt: null, revokedAt: null,
      },
      { transaction },
    );
    const current = toCurrentUser(user, await siteIdsOf(user.id, transaction), deviceId);
    return {
      accessToken: signAccessToken(jwtSecret, { userId: user.id, sessionId: familyId, deviceId }),
      refreshToken,
      user: await loadProfile(current, transaction),
    };
  }

  /** Records the device the person signs in on (a shared phone moves to whoever signed in last). */
  async function registerDevice(userId: string, input: Pick<LoginInput, 'deviceId' | 'deviceName'>, at: Date, transaction: Transaction): Promise<string> {
    const id = input.deviceId ?? randomUUID();
    const existing = await Device.findByPk(id, { transaction });
    if (existing) {
      await existing.update({ userId, name: input.deviceName ?? existing.name, lastSeenAt: at }, { transaction });
    } else {
      await Device.create({ id, userId, name: input.deviceName ?? 'Unnamed device', lastSeenAt: at, lastSyncAt: null }, { transaction });
    }
    return id;
  }

  async function revokeFamily(familyId: string, at: Date, transaction: Transaction): Promise<void> {
    await RefreshToken.update({ revokedAt: at }, { where: { familyId, revokedAt: null }, transaction });
  }

  return {
    /** Checks e-mail and password and starts a sign-in on the named device. */
    async signIn(input: LoginInput): Promise<SignInResult> {
      const user = await User.findOne({ where: { email: input.email } });
      const isMatch = await bcrypt.compare(input.password, user?.passwordHash ?? (await timingDummyHash()));
      if (!user || !user.passwordHash || !isMatch || user.isDisabled) {
        throw new AppError('unauthenticated', WRONG_CREDENTIALS);
      }
      const at = now();
      return database.transaction(async (transaction) => {
        const deviceId = await registerDevice(user.id, input, at, transaction);
        return startSession(user, deviceId, at, transaction);
      });
    },

    /** Starts a sign-in without a password check, for tests and fixtures that act as a user. */
    async startSessionFor(userId: string, deviceId: string | null = null): Promise<SignInResult> {
      const user = await User.findByPk(userId);
      if (!user) {
        throw new AppError('not_found', 'No such user');
      }
      return database.transaction((transaction) => startSession(user, deviceId, now(), transaction));
    },

    /**
     * Exchanges a refresh token for a new pair. A token already exchanged, presented again, was
     * copied: the whole family is revoked (committed before the refusal), so the thief and the
     * owner both have to sign in again.
     */
    async refresh(refreshToken: string): Promise<SignInResult> {
      const at = now();
      const outcome = await database.transaction(async (transaction): Promise<SignInResult | AppError> => {
        const row = await RefreshToken.findOne({ where: { tokenHash: hashOpaqueToken(refreshToken) }, transaction });
        if (!row || row.revokedAt) {
          return new AppError('unauthenticated', SIGN_IN_AGAIN);
        }
        if (row.rotatedAt) {
          await revokeFamily(row.familyId, at, transaction);
          return new AppError('unauthenticated', 'This sign-in was ended because its refresh token was used twice; sign in again', { reason: 'reused' });
        }
        if (row.expiresAt.getTime() <= at.getTime()) {
          return new AppError('unauthenticated', SIGN_IN_AGAIN, { reason: 'expired' });
        }
        const user = await User.findByPk(row.userId, { transaction });
        if (!user || user.isDisabled) {
          await revokeFamily(row.familyId, at, transaction);
          return new AppError('unauthenticated', SIGN_IN_AGAIN);
        }
        await row.update({ rotatedAt: at }, { transaction });
        const next = newOpaqueToken();
        await RefreshToken.create(
          {
            id: randomUUID(), familyId: row.familyId, userId: user.id, deviceId: row.deviceId, tokenHash: hashOpaqueToken(next),
            expiresAt: new Date(at.getTime() + REFRESH_TOKEN_TTL_MS), rotatedAt: null, revokedAt: null,
          },
          { transaction },
        );
        if (row.deviceId) {
          await Device.update({ lastSeenAt: at }, { where: { id: row.deviceId }, transaction });
        }
        const current = toCurrentUser(user, await siteIdsOf(user.id, transaction), row.deviceId);
        return {
          accessToken: signAccessToken(jwtSecret, { userId: user.id, sessionId: row.familyId, deviceId: row.deviceId }),
          refreshToken: next,
          user: await loadProfile(current, transaction),
        };
      });
      if (outcome instanceof AppError) {
        throw outcome;
      }
      return outcome;
    },

    /** Ends the sign-in the refresh token belongs to; unknown tokens are ignored (signing out twice is fine). */
    async signOut(refreshToken: string): Promise<void> {
      const at = now();
      await database.transaction(async (transaction) => {
        const row = await RefreshToken.findOne({ where: { tokenHash: hashOpaqueToken(refreshToken) }, transaction });
        if (row) {
          await revokeFamily(row.familyId, at, transaction);
        }
      });
    },

    /**
     * E-mails a password-reset link when the address belongs to a working account. The answer is
     * the same either way, and the e-mail goes out after the answer, so neither words nor timing
     * tell whether the address is known.
     */
    async requestPasswordReset(email: string): Promise<{ mailSent: Promise<void> }> {
      const user = await User.findOne({ where: { email } });
      if (!user || user.isDisabled) {
        return { mailSent: Promise.resolve() };
      }
      const token = await database.transaction((transaction) => createAccountLink(user.id, 'password-reset', now(), transaction));
      const url = linkUrl(publicUrl, token);
      const mailSent = mail
        .sendMail({
          to: user.email,
          organizationId: user.organizationId,
          subject: 'Reset your Heapsight password',
          text: `Hello ${user.name},\n\nSomeone (we hope you) asked to reset the password of your Heapsight account.\n\nSet a new password here (the link works once, for one hour):\n${url}\n\nIf you did not ask, ignore this message; your password stays as it is.\n`,
          secrets: [url, token],
        })
        .then(() => undefined);
      return { mailSent };
    },

    /** Who an e-mailed link is for, so the page can greet them; refused when the link no longer works. */
    async describeLink(token: string): Promise<{ purpose: string; email: string; name: string; expiresAt: string }> {
      const link = await findUsableLink(token, now());
      const user = link ? await User.findByPk(link.userId) : null;
      if (!link || !user || user.isDisabled) {
        throw new AppError('bad_request', 'This link does not work any more: ask for a new one');
      }
      return { purpose: link.purpose, email: user.email, name: user.name, expiresAt: link.expiresAt.toISOString() };
    },

    /**
     * Sets the password through an e-mailed link, once. Every earlier sign-in of the person ends,
     * so a reset after a lost phone locks the phone out.
     */
    async setPassword(token: string, password: string): Promise<{ email: string }> {
      const passwordHash = await bcrypt.hash(password, PASSWORD_HASH_ROUNDS);
      const at = now();
      return database.transaction(async (transaction) => {
        const link = await findUsableLink(token, at, transaction);
        const user = link ? await User.findByPk(link.userId, { transaction }) : null;
        if (!link || !user || user.isDisabled) {
          throw new AppError('bad_request', 'This link does not work any more: ask for a new one');
        }
        await link.update({ usedAt: at }, { transaction });
        await user.update({ passwordHash }, { transaction });
        await RefreshToken.update({ revokedAt: at }, { where: { userId: user.id, revokedAt: null }, transaction });
        return { email: user.email };
      });
    },
  };
}

/** The sign-in service as the routes use it. */
export type AuthService = ReturnType<typeof createAuthService>;
