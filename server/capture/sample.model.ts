import { DataTypes, Model, type Sequelize } from 'sequelize';
import type { SampleData } from '../../shared/sync/protocol';
import { ownershipAttributes, syncedRecordAttributes, type SyncedRecordFields } from './capture-columns';

/** A field sample taken from a pile (DESIGN §4, field names of §6). */
export class Sample extends Model {
  declare id: string;
  declare pileId: string;
  declare code: string;
  declare sampleType: SampleData['sampleType'];
  declare duplicateOfId: string | null;
  declare standardId: string | null;
  declare location: SampleData['location'];
  declare gpsAccuracyM: number | null;
  declare wetMassKg: number | null;
  declare moisturePct: number | null;
  declare increments: number;
  declare position: string;
  declare collectedAt: Date;
  declare collectorId: string;
}
export interface Sample extends SyncedRecordFields {}

export function initSampleModel(sequelize: Sequelize): void {
  Sample.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      pileId: { type: DataTypes.UUID, allowNull: false },
      code: { type: DataTypes.STRING(24), allowNull: false },
      sampleType: { type: DataTypes.STRING(16), allowNull: false },
      duplicateOfId: { type: DataTypes.UUID, allowNull: true },
      standardId: { type: DataTypes.STRING(64), allowNull: true },
      location: { type: DataTypes.JSON, allowNull: true },
      gpsAccuracyM: { type: DataTypes.DOUBLE, allowNull: true },
      wetMassKg: { type: DataTypes.DOUBLE, allowNull: true },
      moisturePct: { type: DataTypes.DOUBLE, allowNull: true },
      increments: { type: DataTypes.INTEGER, allowNull: false },
      position: { type: DataTypes.STRING(200), allowNull: false },
      collectedAt: { type: DataTypes.DATE, allowNull: false },
      collectorId: { type: DataTypes.UUID, allowNull: false },
      ...ownershipAttributes,
      ...syncedRecordAttributes,
    },
    { sequelize, tableName: 'samples' },
  );
}
