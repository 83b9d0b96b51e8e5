import { DataTypes } from 'sequelize';
import { recordColumns, type Migration } from '../migration';

/**
 * Field records and their sync machinery (DESIGN §4, §5): piles, samples, pan tests and photo
 * records; the one server-wide revision counter; the change log a pull pages through (one row per
 * record, at its latest revision); the mutation ids already applied (for resend safety); the
 * conflicts kept for a geologist; and the short number each device puts in its human codes.
 * Portable column types only (JSON is TEXT on SQLite and json on PostgreSQL).
 */
export const captureSyncPhotos: Migration = {
  name: '0003-capture-sync-photos',
  async up(queryInterface) {
    const timestamps = {
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    };
    const ownership = {
      createdById: { type: DataTypes.UUID, allowNull: false },
      deviceId: { type: DataTypes.STRING(64), allowNull: true },
    };
    await queryInterface.createTable('piles', {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
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
      ...ownership,
      ...recordColumns,
    });
    await queryInterface.addIndex('piles', ['siteId', 'code'], { unique: true });

    await queryInterface.createTable('samples', {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
      pileId: { type: DataTypes.UUID, allowNull: false, references: { model: 'piles', key: 'id' } },
      code: { type: DataTypes.STRING(24), allowNull: false },
      sampleType: { type: DataTypes.STRING(16), allowNull: false },
      duplicateOfId: { type: DataTypes.UUID, allowNull: true },
      standardId: { type: DataTypes.STRING(64), allowNull: true },
      location: { type: DataTypes.JSON, allowNull: true },
      gpsAccuracyM: { type: DataTypes.DOUBLE, allowNull: true },
      wetMassKg: { type: DataTypes.DOUBLE, allowNull: true },
      moisturePct: { type: DataTypes.DOUBLE, allowNull: true },
      increments: { type: DataTypes.INTEGER, allowNull: false },
      position: { type: DataTypes.STRING(200), allowNull: false },
      collectedAt: { type: DataTypes.DATE, allowNull: false },
      collectorId: { type: DataTypes.UUID, allowNull: false },
      ...ownership,
      ...recordColumns,
    });
    await queryInterface.addIndex('samples', ['siteId', 'code'], { unique: true });
    await queryInterface.addIndex('samples', ['pileId']);

    await queryInterface.createTable('pan_tests', {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
      sampleId: { type: DataTypes.UUID, allowNull: false, references: { model: 'samples', key: 'id' } },
      massPannedKg: { type: DataTypes.DOUBLE, allowNull: false },
      colours: { type: DataTypes.JSON, allowNull: false },
      goldMassMg: { type: DataTypes.DOUBLE, allowNull: true },
      panEfficiency: { type: DataTypes.DOUBLE, allowNull: true },
      testedAt: { type: DataTypes.DATE, allowNull: false },
      ...ownership,
      ...recordColumns,
    });
    await queryInterface.addIndex('pan_tests', ['sampleId']);

    await queryInterface.createTable('photos', {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false, references: { model: 'sites', key: 'id' } },
      ownerEntity: { type: DataTypes.STRING(16), allowNull: false },
      ownerId: { type: DataTypes.UUID, allowNull: false },
      contentType: { type: DataTypes.STRING(32), allowNull: false },
      originalWidth: { type: DataTypes.INTEGER, allowNull: false },
      originalHeight: { type: DataTypes.INTEGER, allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
      takenAt: { type: DataTypes.DATE, allowNull: false },
      /** Which sizes the photo store holds: [] until uploaded, then "full", then "thumb". */
      storedSizes: { type: DataTypes.JSON, allowNull: false },
      ...ownership,
      ...recordColumns,
    });
    await queryInterface.addIndex('photos', ['ownerEntity', 'ownerId']);

    await queryInterface.createTable('sync_revisions', {
      id: { type: DataTypes.INTEGER, primaryKey: true },
      value: { type: DataTypes.BIGINT, allowNull: false },
      ...timestamps,
    });
    const now = new Date();
    await queryInterface.bulkInsert('sync_revisions', [{ id: 1, value: 0, createdAt: now, updatedAt: now }]);

    await queryInterface.createTable('change_log', {
      entity: { type: DataTypes.STRING(16), primaryKey: true },
      recordId: { type: DataTypes.UUID, primaryKey: true },
      revision: { type: DataTypes.BIGINT, allowNull: false, unique: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      isDeleted: { type: DataTypes.BOOLEAN, allowNull: false },
      ...timestamps,
    });
    await queryInterface.addIndex('change_log', ['siteId', 'revision']);

    await queryInterface.createTable('sync_mutations', {
      mutationId: { type: DataTypes.UUID, primaryKey: true },
      deviceId: { type: DataTypes.STRING(64), allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      entity: { type: DataTypes.STRING(16), allowNull: false },
      recordId: { type: DataTypes.UUID, allowNull: false },
      status: { type: DataTypes.STRING(16), allowNull: false },
      revision: { type: DataTypes.BIGINT, allowNull: true },
      conflictId: { type: DataTypes.UUID, allowNull: true },
      ...timestamps,
    });

    await queryInterface.createTable('sync_conflicts', {
      id: { type: DataTypes.UUID, primaryKey: true },
      entity: { type: DataTypes.STRING(16), allowNull: false },
      recordId: { type: DataTypes.UUID, allowNull: false },
      siteId: { type: DataTypes.UUID, allowNull: false },
      mutationId: { type: DataTypes.UUID, allowNull: false },
      deviceId: { type: DataTypes.STRING(64), allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      baseRevision: { type: DataTypes.BIGINT, allowNull: true },
      serverRevision: { type: DataTypes.BIGINT, allowNull: false },
      deviceOp: { type: DataTypes.STRING(8), allowNull: false },
      deviceData: { type: DataTypes.JSON, allowNull: true },
      serverData: { type: DataTypes.JSON, allowNull: true },
      status: { type: DataTypes.STRING(16), allowNull: false },
      resolution: { type: DataTypes.STRING(16), allowNull: true },
      resolvedById: { type: DataTypes.UUID, allowNull: true },
      resolvedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestamps,
    });
    await queryInterface.addIndex('sync_conflicts', ['siteId', 'status']);

    await queryInterface.createTable('device_numbers', {
      deviceId: { type: DataTypes.STRING(64), primaryKey: true },
      number: { type: DataTypes.INTEGER, allowNull: false, unique: true },
      userId: { type: DataTypes.UUID, allowNull: false },
      ...timestamps,
    });
  },
  async down(queryInterface) {
    for (const table of ['device_numbers', 'sync_conflicts', 'sync_mutations', 'change_log', 'sync_revisions', 'photos', 'pan_tests', 'samples', 'piles']) {
      await queryInterface.dropTable(table);
    }
  },
};
