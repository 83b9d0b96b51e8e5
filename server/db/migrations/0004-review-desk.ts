import { DataTypes } from 'sequelize';
import type { Migration } from '../migration';

/**
 * The review desk: one georeferenced background image per site (e.g. a drone orthophoto), drawn
 * under the site map when there is no tile server. The bytes live in DATA_DIR/site-images; the
 * row holds the type, pixel size and the lon/lat box the image covers (north-up, axis-aligned).
 */
export const reviewDesk: Migration = {
  name: '0004-review-desk',
  async up(queryInterface) {
    await queryInterface.createTable('site_images', {
      siteId: { type: DataTypes.UUID, primaryKey: true, references: { model: 'sites', key: 'id' } },
      contentType: { type: DataTypes.STRING(32), allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
      widthPx: { type: DataTypes.INTEGER, allowNull: false },
      heightPx: { type: DataTypes.INTEGER, allowNull: false },
      west: { type: DataTypes.DOUBLE, allowNull: false },
      south: { type: DataTypes.DOUBLE, allowNull: false },
      east: { type: DataTypes.DOUBLE, allowNull: false },
      north: { type: DataTypes.DOUBLE, allowNull: false },
      uploadedById: { type: DataTypes.UUID, allowNull: false },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
  },
  async down(queryInterface) {
    await queryInterface.dropTable('site_images');
  },
};
