import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * One refresh token, stored as its hash. Every sign-in starts a family; each refresh rotates to a
 * new token of the same family. A rotated token presented again means it was copied, so the whole
 * family is revoked.
 */
export class RefreshToken extends Model<InferAttributes<RefreshToken>, InferCreationAttributes<RefreshToken>> {
  declare id: string;
  declare familyId: string;
  declare userId: string;
  declare deviceId: string | null;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare rotatedAt: Date | null;
  declare revokedAt: Date | null;
  declare createdAt?: Date;
  declare updatedAt?: Date;
}

export function initRefreshTokenModel(sequelize: Sequelize): void {
  RefreshToken.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      familyId: { type: DataTypes.UUID, allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      deviceId: { type: DataTypes.UUID, allowNull: true },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      rotatedAt: { type: DataTypes.DATE, allowNull: true },
      revokedAt: { type: DataTypes.DATE, allowNull: true },
    },
    { sequelize, tableName: 'refresh_tokens' },
  );
}
