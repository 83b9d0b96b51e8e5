import { DataTypes } from 'sequelize';
import { recordColumns, type Migration } from '../migration';

/** Organisations, their sites, people and who belongs to which site (DESIGN §1, §4). */
export const organizationsSitesUsers: Migration = {
  name: '0001-organizations-sites-users',
  async up(queryInterface) {
    await queryInterface.createTable('organizations', {
      id: { type: DataTypes.UUID, primaryKey: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      ...recordColumns,
    });
    await queryInterface.createTable('sites', {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' } },
      code: { type: DataTypes.STRING(8), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      processingLat: { type: DataTypes.DOUBLE, allowNull: true },
      processingLon: { type: DataTypes.DOUBLE, allowNull: true },
      /** Default economic parameters as JSON text, read and checked by the shortlist service. */
      economics: { type: DataTypes.TEXT, allowNull: true },
      ...recordColumns,
    });
    await queryInterface.createTable('users', {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' } },
      email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      role: { type: DataTypes.STRING(16), allowNull: false },
      /** Lab users belong to one laboratory and see only its batches. */
      labName: { type: DataTypes.STRING(200), allowNull: true },
      passwordHash: { type: DataTypes.STRING(100), allowNull: true },
      isDisabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...recordColumns,
    });
    await queryInterface.createTable('memberships', {
      id: { type: DataTypes.UUID, primaryKey: true },
      userId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await queryInterface.addIndex('memberships', ['userId', 'siteId'], { unique: true });
    await queryInterface.addIndex('memberships', ['siteId']);
  },
  async down(queryInterface) {
    await queryInterface.dropTable('memberships');
    await queryInterface.dropTable('users');
    await queryInterface.dropTable('sites');
    await queryInterface.dropTable('organizations');
  },
};
