import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { recordAttributes } from '../db/record-attributes';

/** A mine camp with its piles; the processing point is where hauled material goes. */
export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: string;
  declare organizationId: string;
  declare code: string;
  declare name: string;
  declare processingLat: number | null;
  declare processingLon: number | null;
  declare economics: string | null;
  declare createdAt?: Date;
  declare updatedAt?: Date;
  declare revision?: number;
  declare deletedAt?: Date | null;
}

export function initSiteModel(sequelize: Sequelize): void {
  Site.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false },
      code: { type: DataTypes.STRING(8), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      processingLat: { type: DataTypes.DOUBLE, allowNull: true },
      processingLon: { type: DataTypes.DOUBLE, allowNull: true },
      economics: { type: DataTypes.TEXT, allowNull: true },
      ...recordAttributes,
    },
    { sequelize, tableName: 'sites', paranoid: true },
  );
}
