import { DataTypes, Model, type Sequelize } from 'sequelize';
import { ownershipAttributes, syncedRecordAttributes, type SyncedRecordFields } from '../capture/capture-columns';

/** Sizes the photo store can hold for one photo. */
export type StoredSize = 'full' | 'thumb';

/** The record of a photo of a pile or sample; its bytes live in the photo store. */
export class Photo extends Model {
  declare id: string;
  declare ownerEntity: 'pile' | 'sample';
  declare ownerId: string;
  declare contentType: 'image/jpeg' | 'image/png' | 'image/webp';
  declare originalWidth: number;
  declare originalHeight: number;
  declare byteSize: number;
  declare takenAt: Date;
  declare storedSizes: StoredSize[];
}
export interface Photo extends SyncedRecordFields {}

export function initPhotoModel(sequelize: Sequelize): void {
  Photo.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      ownerEntity: { type: DataTypes.STRING(16), allowNull: false },
      ownerId: { type: DataTypes.UUID, allowNull: false },
      contentType: { type: DataTypes.STRING(32), allowNull: false },
      originalWidth: { type: DataTypes.INTEGER, allowNull: false },
      originalHeight: { type: DataTypes.INTEGER, allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
      takenAt: { type: DataTypes.DATE, allowNull: false },
      storedSizes: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      ...ownershipAttributes,
      ...syncedRecordAttributes,
    },
    { sequelize, tableName: 'photos' },
  );
}
