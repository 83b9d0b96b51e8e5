import { DataTypes, Model, type Sequelize } from 'sequelize';
import type { PanTestData } from '../../shared/sync/protocol';
import { ownershipAttributes, syncedRecordAttributes, type SyncedRecordFields } from './capture-columns';

/** A pan test of a sample: colours per size class or weighed gold (DESIGN §4, §6). */
export class PanTest extends Model {
  declare id: string;
  declare sampleId: string;
  declare massPannedKg: number;
  declare colours: PanTestData['colours'];
  declare goldMassMg: number | null;
  declare panEfficiency: number | null;
  declare testedAt: Date;
}
export interface PanTest extends SyncedRecordFields {}

export function initPanTestModel(sequelize: Sequelize): void {
  PanTest.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      sampleId: { type: DataTypes.UUID, allowNull: false },
      massPannedKg: { type: DataTypes.DOUBLE, allowNull: false },
      colours: { type: DataTypes.JSON, allowNull: false },
      goldMassMg: { type: DataTypes.DOUBLE, allowNull: true },
      panEfficiency: { type: DataTypes.DOUBLE, allowNull: true },
      testedAt: { type: DataTypes.DATE, allowNull: false },
      ...ownershipAttributes,
      ...syncedRecordAttributes,
    },
    { sequelize, tableName: 'pan_tests' },
  );
}
