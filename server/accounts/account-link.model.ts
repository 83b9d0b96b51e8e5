import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Why a single-use link was e-mailed. */
export type AccountLinkPurpose = 'invitation' | 'password-reset';

/** A single-use, expiring link to set a password, stored as the hash of its token. */
export class AccountLink extends Model<InferAttributes<AccountLink>, InferCreationAttributes<AccountLink>> {
  declare id: string;
  declare userId: string;
  declare purpose: AccountLinkPurpose;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt?: Date;
  declare updatedAt?: Date;
}

export function initAccountLinkModel(sequelize: Sequelize): void {
  AccountLink.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      userId: { type: DataTypes.UUID, allowNull: false },
      purpose: { type: DataTypes.STRING(16), allowNull: false },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
    },
    { sequelize, tableName: 'account_links' },
  );
}
