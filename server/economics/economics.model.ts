import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { recordAttributes } from '../db/record-attributes';
import type { EconomicParameters } from './economics-parameters';

/** A site's economic parameters as the manager last set them (one row per site). */
export class SiteEconomicsRecord extends Model<InferAttributes<SiteEconomicsRecord>, InferCreationAttributes<SiteEconomicsRecord>> {
  declare siteId: string;
  declare parameters: EconomicParameters;
  declare updatedById: string;
  declare createdAt?: Date;
  declare updatedAt?: Date;
  declare revision?: number;
  declare deletedAt?: Date | null;
}

/** One changed parameter: who, when, old → new. Written once, never changed. */
export class EconomicsChange extends Model<InferAttributes<EconomicsChange>, InferCreationAttributes<EconomicsChange>> {
  declare id: string;
  declare siteId: string;
  declare parameter: string;
  declare oldValue: string | number | null;
  declare newValue: string | number | null;
  declare changedById: string;
  declare changedByName: string;
  declare changedAt: Date;
}

export function initEconomicsModels(sequelize: Sequelize): void {
  SiteEconomicsRecord.init(
    {
      siteId: { type: DataTypes.UUID, primaryKey: true },
      parameters: { type: DataTypes.JSON, allowNull: false },
      updatedById: { type: DataTypes.UUID, allowNull: false },
      ...recordAttributes,
      deletedAt: { type: DataTypes.DATE, allowNull: true },
    },
    { sequelize, tableName: 'site_economics' },
  );
  EconomicsChange.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      parameter: { type: DataTypes.STRING(40), allowNull: false },
      oldValue: { type: DataTypes.JSON, allowNull: true },
      newValue: { type: DataTypes.JSON, allowNull: true },
      changedById: { type: DataTypes.UUID, allowNull: false },
      changedByName: { type: DataTypes.STRING(200), allowNull: false },
      changedAt: { type: DataTypes.DATE, allowNull: false },
    },
    { sequelize, tableName: 'economics_changes', timestamps: false },
  );
}
