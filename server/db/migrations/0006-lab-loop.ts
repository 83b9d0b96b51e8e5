import { DataTypes } from 'sequelize';
import type { Migration } from '../migration';

/**
 * The assay-lab loop (DESIGN §2 step 6, §4): reference standards; lab batches with their chain of
 * custody; the items of a batch in dispatch order (field samples, and the blanks, standards and
 * split duplicates inserted for QA/QC); every results file imported (who, when, which file by its
 * SHA-256); assay results, of which only rows with no `supersededAt` are current (a corrected
 * re-import supersedes and keeps the old row as history); and per site whether the pan-test
 * calibration is applied to samples without an assay. Portable column types only.
 */
export const labLoop: Migration = {
  name: '0006-lab-loop',
  async up(queryInterface) {
    const timestamps = {
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    };
    await queryInterface.createTable('reference_standards', {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' } },
      code: { type: DataTypes.STRING(64), allowNull: false },
      expectedGpt: { type: DataTypes.DOUBLE, allowNull: false },
      sdGpt: { type: DataTypes.DOUBLE, allowNull: false },
      description: { type: DataTypes.STRING(300), allowNull: false },
      ...timestamps,
    });
    await queryInterface.addIndex('reference_standards', ['organizationId', 'code'], { unique: true });

    await queryInterface.createTable('lab_batches', {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' } },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
      code: { type: DataTypes.STRING(32), allowNull: false, unique: true },
      labName: { type: DataTypes.STRING(200), allowNull: false },
      labContactEmail: { type: DataTypes.STRING(320), allowNull: false },
      method: { type: DataTypes.STRING(120), allowNull: false },
      chargeMassG: { type: DataTypes.DOUBLE, allowNull: false },
      detectionLimitGpt: { type: DataTypes.DOUBLE, allowNull: false },
      upperLimitGpt: { type: DataTypes.DOUBLE, allowNull: true },
      isBlind: { type: DataTypes.BOOLEAN, allowNull: false },
      qcPlan: { type: DataTypes.JSON, allowNull: false },
      status: { type: DataTypes.STRING(16), allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: false },
      dispatchedBy: { type: DataTypes.STRING(200), allowNull: true },
      dispatchedAt: { type: DataTypes.DATE, allowNull: true },
      carrier: { type: DataTypes.STRING(200), allowNull: true },
      sealNumbers: { type: DataTypes.STRING(500), allowNull: true },
      receivedBy: { type: DataTypes.STRING(200), allowNull: true },
      receivedAt: { type: DataTypes.DATE, allowNull: true },
      conditionOnReceipt: { type: DataTypes.STRING(500), allowNull: true },
      sentAt: { type: DataTypes.DATE, allowNull: true },
      createdById: { type: DataTypes.UUID, allowNull: false },
      ...timestamps,
    });
    await queryInterface.addIndex('lab_batches', ['siteId']);
    await queryInterface.addIndex('lab_batches', ['labName']);

    await queryInterface.createTable('lab_batch_samples', {
      id: { type: DataTypes.UUID, primaryKey: true },
      batchId: { type: DataTypes.UUID, allowNull: false, references: { model: 'lab_batches', key: 'id' } },
      position: { type: DataTypes.INTEGER, allowNull: false },
      labCode: { type: DataTypes.STRING(40), allowNull: false },
      itemType: { type: DataTypes.STRING(16), allowNull: false },
      isInserted: { type: DataTypes.BOOLEAN, allowNull: false },
      sampleId: { type: DataTypes.UUID, allowNull: true, references: { model: 'samples', key: 'id' } },
      duplicateOfItemId: { type: DataTypes.UUID, allowNull: true },
      standardCode: { type: DataTypes.STRING(64), allowNull: true },
      material: { type: DataTypes.STRING(32), allowNull: true },
      massKg: { type: DataTypes.DOUBLE, allowNull: true },
      ...timestamps,
    });
    await queryInterface.addIndex('lab_batch_samples', ['batchId', 'position'], { unique: true });
    await queryInterface.addIndex('lab_batch_samples', ['batchId', 'labCode'], { unique: true });
    await queryInterface.addIndex('lab_batch_samples', ['sampleId']);

    await queryInterface.createTable('result_imports', {
      id: { type: DataTypes.UUID, primaryKey: true },
      batchId: { type: DataTypes.UUID, allowNull: false, references: { model: 'lab_batches', key: 'id' } },
      fileName: { type: DataTypes.STRING(255), allowNull: false },
      fileHash: { type: DataTypes.STRING(64), allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
      rowCount: { type: DataTypes.INTEGER, allowNull: false },
      changedCount: { type: DataTypes.INTEGER, allowNull: false },
      importedById: { type: DataTypes.UUID, allowNull: false },
      importedAt: { type: DataTypes.DATE, allowNull: false },
      ...timestamps,
    });
    await queryInterface.addIndex('result_imports', ['batchId', 'fileHash']);

    await queryInterface.createTable('assay_results', {
      id: { type: DataTypes.UUID, primaryKey: true },
      batchId: { type: DataTypes.UUID, allowNull: false, references: { model: 'lab_batches', key: 'id' } },
      batchSampleId: { type: DataTypes.UUID, allowNull: false, references: { model: 'lab_batch_samples', key: 'id' } },
      sampleId: { type: DataTypes.UUID, allowNull: true },
      valueGpt: { type: DataTypes.DOUBLE, allowNull: false },
      isBelowDetection: { type: DataTypes.BOOLEAN, allowNull: false },
      isAboveRange: { type: DataTypes.BOOLEAN, allowNull: false },
      detectionLimitGpt: { type: DataTypes.DOUBLE, allowNull: true },
      rawValue: { type: DataTypes.STRING(64), allowNull: false },
      method: { type: DataTypes.STRING(120), allowNull: false },
      labJob: { type: DataTypes.STRING(64), allowNull: true },
      importId: { type: DataTypes.UUID, allowNull: false, references: { model: 'result_imports', key: 'id' } },
      supersededAt: { type: DataTypes.DATE, allowNull: true },
      supersededByImportId: { type: DataTypes.UUID, allowNull: true },
      ...timestamps,
    });
    await queryInterface.addIndex('assay_results', ['batchSampleId']);
    await queryInterface.addIndex('assay_results', ['sampleId']);

    await queryInterface.createTable('site_calibrations', {
      siteId: { type: DataTypes.UUID, primaryKey: true, references: { model: 'sites', key: 'id' } },
      isApplied: { type: DataTypes.BOOLEAN, allowNull: false },
      changedById: { type: DataTypes.UUID, allowNull: false },
      ...timestamps,
    });
  },
  async down(queryInterface) {
    for (const table of ['site_calibrations', 'assay_results', 'result_imports', 'lab_batch_samples', 'lab_batches', 'reference_standards']) {
      await queryInterface.dropTable(table);
    }
  },
};
