import { DataTypes, Model, type Sequelize } from 'sequelize';

/** The georeferenced background image of a site: its type, pixel size and the lon/lat box it covers. */
export class SiteImage extends Model {
  declare siteId: string;
  declare contentType: string;
  declare byteSize: number;
  declare widthPx: number;
  declare heightPx: number;
  declare west: number;
  declare south: number;
  declare east: number;
  declare north: number;
  declare uploadedById: string;
  declare createdAt: Date;
  declare updatedAt: Date;
}

/** Binds the model, once at start-up. */
export function initSiteImageModel(sequelize: Sequelize): void {
  SiteImage.init(
    {
      siteId: { type: DataTypes.UUID, primaryKey: true },
      contentType: { type: DataTypes.STRING(32), allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
      widthPx: { type: DataTypes.INTEGER, allowNull: false },
      heightPx: { type: DataTypes.INTEGER, allowNull: false },
      west: { type: DataTypes.DOUBLE, allowNull: false },
      south: { type: DataTypes.DOUBLE, allowNull: false },
      east: { type: DataTypes.DOUBLE, allowNull: false },
      north: { type: DataTypes.DOUBLE, allowNull: false },
      uploadedById: { type: DataTypes.UUID, allowNull: false },
    },
    { sequelize, tableName: 'site_images' },
  );
}
