import { randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { AccountLink, type AccountLinkPurpose } from './account-link.model';
import { hashOpaqueToken, newOpaqueToken } from './tokens';

/** How long an e-mailed link works: a week to accept an invitation, an hour to reset a password. */
export const LINK_TTL_MS: Record<AccountLinkPurpose, number> = {
  invitation: 7 * 24 * 60 * 60 * 1000,
  'password-reset': 60 * 60 * 1000,
};

/** Makes a new single-use link for the user; any earlier unused link of theirs stops working. */
export async function createAccountLink(userId: string, purpose: AccountLinkPurpose, now: Date, transaction: Transaction): Promise<string> {
  await AccountLink.update({ usedAt: now }, { where: { userId, usedAt: null }, transaction });
  const token = newOpaqueToken();
  await AccountLink.create(
    { id: randomUUID(), userId, purpose, tokenHash: hashOpaqueToken(token), expiresAt: new Date(now.getTime() + LINK_TTL_MS[purpose]), usedAt: null },
    { transaction },
  );
  return token;
}

/** The link a token stands for while it still works (unused and unexpired), else null. */
export async function findUsableLink(token: string, now: Date, transaction?: Transaction): Promise<AccountLink | null> {
  return AccountLink.findOne({
    where: { tokenHash: hashOpaqueToken(token), usedAt: null, expiresAt: { [Op.gt]: now } },
    transaction,
  });
}

/** The address the e-mailed link opens: the app's set-password page. */
export function linkUrl(publicUrl: string, token: string): string {
  return `${publicUrl.replace(/\/+$/, '')}/set-password?token=${encodeURIComponent(token)}`;
}
