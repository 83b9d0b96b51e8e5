import { DataTypes } from 'sequelize';
import type { Migration } from '../migration';

/**
 * Printed sample-label sheets (issue 12): each sheet reserves a run of sequence numbers for its
 * site. The unique index on (siteId, firstSequence) makes two concurrent reservations of the same
 * run fail on PostgreSQL as well as SQLite, so two sheets never carry the same code.
 */
export const labelRanges: Migration = {
  name: '0008-label-ranges',
  async up(queryInterface) {
    await queryInterface.createTable('label_ranges', {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
      deviceNumber: { type: DataTypes.INTEGER, allowNull: false },
      firstSequence: { type: DataTypes.INTEGER, allowNull: false },
      lastSequence: { type: DataTypes.INTEGER, allowNull: false },
      printedById: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' } },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await queryInterface.addIndex('label_ranges', { name: 'label_ranges_site_first', unique: true, fields: ['siteId', 'firstSequence'] });
  },
  async down(queryInterface) {
    await queryInterface.dropTable('label_ranges');
  },
};
