import { DataTypes } from 'sequelize';
import { recordAttributes } from '../db/record-attributes';

/** Who made a field record and on which device; the server sets these, never the payload. */
export const ownershipAttributes = {
  createdById: { type: DataTypes.UUID, allowNull: false },
  deviceId: { type: DataTypes.STRING(64), allowNull: true },
};

/** The sync columns every field record carries (see recordColumns in the migrations). */
export const syncedRecordAttributes = {
  ...recordAttributes,
  deletedAt: { type: DataTypes.DATE, allowNull: true },
};

/** Fields every field-record model declares besides its own. */
export interface SyncedRecordFields {
  siteId: string;
  createdById: string;
  deviceId: string | null;
  revision: number;
  deletedAt: Date | null;
  createdAt?: Date;
  updatedAt?: Date;
}
