import { DataTypes } from 'sequelize';
import { recordColumns, type Migration } from '../migration';

/**
 * Trials and the money behind the shortlist (DESIGN §2 steps 7–8, §4 `Trial`): test runs over the
 * table with their masses and assays; each site's economic parameters as the manager last set
 * them; and one row per changed parameter (who, when, old → new), never updated or deleted.
 * Portable column types only (JSON is TEXT on SQLite and json on PostgreSQL).
 */
export const trialsEconomics: Migration = {
  name: '0005-trials-economics',
  async up(queryInterface) {
    await queryInterface.createTable('trials', {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
      pileIds: { type: DataTypes.JSON, allowNull: false },
      trialDate: { type: DataTypes.STRING(10), allowNull: false },
      equipmentNote: { type: DataTypes.TEXT, allowNull: false },
      feedMassKg: { type: DataTypes.DOUBLE, allowNull: false },
      feedGradeGpt: { type: DataTypes.DOUBLE, allowNull: false },
      concentrateMassKg: { type: DataTypes.DOUBLE, allowNull: false },
      concentrateGradeGpt: { type: DataTypes.DOUBLE, allowNull: false },
      tailingsGradeGpt: { type: DataTypes.DOUBLE, allowNull: false },
      middlingsMassKg: { type: DataTypes.DOUBLE, allowNull: true },
      middlingsGradeGpt: { type: DataTypes.DOUBLE, allowNull: true },
      status: { type: DataTypes.STRING(16), allowNull: false },
      createdById: { type: DataTypes.UUID, allowNull: false },
      ...recordColumns,
    });
    await queryInterface.addIndex('trials', ['siteId', 'trialDate']);

    await queryInterface.createTable('site_economics', {
      siteId: { type: DataTypes.UUID, primaryKey: true, references: { model: 'sites', key: 'id' } },
      parameters: { type: DataTypes.JSON, allowNull: false },
      updatedById: { type: DataTypes.UUID, allowNull: false },
      ...recordColumns,
    });

    await queryInterface.createTable('economics_changes', {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
      parameter: { type: DataTypes.STRING(40), allowNull: false },
      oldValue: { type: DataTypes.JSON, allowNull: true },
      newValue: { type: DataTypes.JSON, allowNull: true },
      changedById: { type: DataTypes.UUID, allowNull: false },
      changedByName: { type: DataTypes.STRING(200), allowNull: false },
      changedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await queryInterface.addIndex('economics_changes', ['siteId', 'changedAt']);
  },
  async down(queryInterface) {
    await queryInterface.dropTable('economics_changes');
    await queryInterface.dropTable('site_economics');
    await queryInterface.dropTable('trials');
  },
};
