import { DataTypes, Model, type Sequelize } from 'sequelize';
import type { PileData } from '../../shared/sync/protocol';
import { ownershipAttributes, syncedRecordAttributes, type SyncedRecordFields } from './capture-columns';

/** A waste pile, dump or pit tagged in the field (DESIGN §4, field names of §6). */
export class Pile extends Model {
  declare id: string;
  declare code: string;
  declare material: PileData['material'];
  declare footprint: PileData['footprint'];
  declare heightM: number | null;
  declare shapeModel: PileData['shapeModel'];
  declare angleOfReposeDeg: number | null;
  declare bulkDensityTPerM3: number | null;
  declare moisturePct: number | null;
  declare spotHeights: PileData['spotHeights'];
  declare sackCount: number | null;
  declare sackMassKg: number | null;
  declare hazards: PileData['hazards'];
  declare notes: string;
}
export interface Pile extends SyncedRecordFields {}

export function initPileModel(sequelize: Sequelize): void {
  Pile.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      code: { type: DataTypes.STRING(24), allowNull: false },
      material: { type: DataTypes.STRING(32), allowNull: false },
      footprint: { type: DataTypes.JSON, allowNull: true },
      heightM: { type: DataTypes.DOUBLE, allowNull: true },
      shapeModel: { type: DataTypes.STRING(16), allowNull: false },
      angleOfReposeDeg: { type: DataTypes.DOUBLE, allowNull: true },
      bulkDensityTPerM3: { type: DataTypes.DOUBLE, allowNull: true },
      moisturePct: { type: DataTypes.DOUBLE, allowNull: true },
      spotHeights: { type: DataTypes.JSON, allowNull: true },
      sackCount: { type: DataTypes.INTEGER, allowNull: true },
      sackMassKg: { type: DataTypes.DOUBLE, allowNull: true },
      hazards: { type: DataTypes.JSON, allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: false },
      ...ownershipAttributes,
      ...syncedRecordAttributes,
    },
    { sequelize, tableName: 'piles' },
  );
}
