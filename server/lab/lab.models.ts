import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Where a batch stands: being put together, sent to the lab, received by it, results back. */
export type LabBatchStatus = 'draft' | 'dispatched' | 'received' | 'reported';

/** What an item of a batch is. Field samples keep their sample type; inserted QA/QC items are blank, standard or split duplicate. */
export type BatchItemType = 'routine' | 'duplicate' | 'blank' | 'standard';

/** How QA/QC items were inserted into a batch, kept so the order can be re-derived from the seed. */
export interface QcPlan {
  readonly blankEvery: number;
  readonly standardEvery: number;
  readonly duplicateEvery: number;
  readonly standardCodes: readonly string[];
  readonly seed: number;
}

/** A certified reference material: expected gold grade and its standard deviation (DESIGN §4). */
export class ReferenceStandard extends Model<InferAttributes<ReferenceStandard>, InferCreationAttributes<ReferenceStandard>> {
  declare id: string;
  declare organizationId: string;
  declare code: string;
  declare expectedGpt: number;
  declare sdGpt: number;
  declare description: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** A batch of samples sent to one laboratory, with its chain of custody. */
export class LabBatch extends Model<InferAttributes<LabBatch>, InferCreationAttributes<LabBatch>> {
  declare id: string;
  declare organizationId: string;
  declare siteId: string;
  declare code: string;
  declare labName: string;
  declare labContactEmail: string;
  declare method: string;
  declare chargeMassG: number;
  declare detectionLimitGpt: number;
  declare upperLimitGpt: number | null;
  declare isBlind: boolean;
  declare qcPlan: QcPlan;
  declare status: LabBatchStatus;
  declare notes: string;
  declare dispatchedBy: string | null;
  declare dispatchedAt: Date | null;
  declare carrier: string | null;
  declare sealNumbers: string | null;
  declare receivedBy: string | null;
  declare receivedAt: Date | null;
  declare conditionOnReceipt: string | null;
  declare sentAt: Date | null;
  declare createdById: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One bag of a batch, at its place in the dispatch order, under the code the lab sees. */
export class LabBatchSample extends Model<InferAttributes<LabBatchSample>, InferCreationAttributes<LabBatchSample>> {
  declare id: string;
  declare batchId: string;
  declare position: number;
  declare labCode: string;
  declare itemType: BatchItemType;
  /** True for the blanks, standards and split duplicates the batch inserted (not field samples). */
  declare isInserted: boolean;
  declare sampleId: string | null;
  declare duplicateOfItemId: string | null;
  declare standardCode: string | null;
  declare material: string | null;
  declare massKg: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One results file imported into a batch: who, when, which file. */
export class ResultImport extends Model<InferAttributes<ResultImport>, InferCreationAttributes<ResultImport>> {
  declare id: string;
  declare batchId: string;
  declare fileName: string;
  declare fileHash: string;
  declare byteSize: number;
  declare rowCount: number;
  declare changedCount: number;
  declare importedById: string;
  declare importedAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** An assay of one batch item (g/t); current while `supersededAt` is null. */
export class AssayResult extends Model<InferAttributes<AssayResult>, InferCreationAttributes<AssayResult>> {
  declare id: string;
  declare batchId: string;
  declare batchSampleId: string;
  declare sampleId: string | null;
  declare valueGpt: number;
  declare isBelowDetection: boolean;
  declare isAboveRange: boolean;
  declare detectionLimitGpt: number | null;
  declare rawValue: string;
  declare method: string;
  declare labJob: string | null;
  declare importId: string;
  declare supersededAt: Date | null;
  declare supersededByImportId: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** Whether a site's pan-test calibration is applied to its samples without an assay. */
export class SiteCalibration extends Model<InferAttributes<SiteCalibration>, InferCreationAttributes<SiteCalibration>> {
  declare siteId: string;
  declare isApplied: boolean;
  declare changedById: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const timestamps = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE };

/** Binds the lab-loop models (table layout in migration 0006). */
export function initLabModels(sequelize: Sequelize): void {
  ReferenceStandard.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false },
      code: { type: DataTypes.STRING(64), allowNull: false },
      expectedGpt: { type: DataTypes.DOUBLE, allowNull: false },
      sdGpt: { type: DataTypes.DOUBLE, allowNull: false },
      description: { type: DataTypes.STRING(300), allowNull: false },
      ...timestamps,
    },
    { sequelize, tableName: 'reference_standards' },
  );
  LabBatch.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false },
      siteId: { type: DataTypes.UUID, allowNull: false },
      code: { type: DataTypes.STRING(32), allowNull: false },
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
    },
    { sequelize, tableName: 'lab_batches' },
  );
  LabBatchSample.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      batchId: { type: DataTypes.UUID, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false },
      labCode: { type: DataTypes.STRING(40), allowNull: false },
      itemType: { type: DataTypes.STRING(16), allowNull: false },
      isInserted: { type: DataTypes.BOOLEAN, allowNull: false },
      sampleId: { type: DataTypes.UUID, allowNull: true },
      duplicateOfItemId: { type: DataTypes.UUID, allowNull: true },
      standardCode: { type: DataTypes.STRING(64), allowNull: true },
      material: { type: DataTypes.STRING(32), allowNull: true },
      massKg: { type: DataTypes.DOUBLE, allowNull: true },
      ...timestamps,
    },
    { sequelize, tableName: 'lab_batch_samples' },
  );
  ResultImport.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      batchId: { type: DataTypes.UUID, allowNull: false },
      fileName: { type: DataTypes.STRING(255), allowNull: false },
      fileHash: { type: DataTypes.STRING(64), allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
      rowCount: { type: DataTypes.INTEGER, allowNull: false },
      changedCount: { type: DataTypes.INTEGER, allowNull: false },
      importedById: { type: DataTypes.UUID, allowNull: false },
      importedAt: { type: DataTypes.DATE, allowNull: false },
      ...timestamps,
    },
    { sequelize, tableName: 'result_imports' },
  );
  AssayResult.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      batchId: { type: DataTypes.UUID, allowNull: false },
      batchSampleId: { type: DataTypes.UUID, allowNull: false },
      sampleId: { type: DataTypes.UUID, allowNull: true },
      valueGpt: { type: DataTypes.DOUBLE, allowNull: false },
      isBelowDetection: { type: DataTypes.BOOLEAN, allowNull: false },
      isAboveRange: { type: DataTypes.BOOLEAN, allowNull: false },
      detectionLimitGpt: { type: DataTypes.DOUBLE, allowNull: true },
      rawValue: { type: DataTypes.STRING(64), allowNull: false },
      method: { type: DataTypes.STRING(120), allowNull: false },
      labJob: { type: DataTypes.STRING(64), allowNull: true },
      importId: { type: DataTypes.UUID, allowNull: false },
      supersededAt: { type: DataTypes.DATE, allowNull: true },
      supersededByImportId: { type: DataTypes.UUID, allowNull: true },
      ...timestamps,
    },
    { sequelize, tableName: 'assay_results' },
  );
  SiteCalibration.init(
    {
      siteId: { type: DataTypes.UUID, primaryKey: true },
      isApplied: { type: DataTypes.BOOLEAN, allowNull: false },
      changedById: { type: DataTypes.UUID, allowNull: false },
      ...timestamps,
    },
    { sequelize, tableName: 'site_calibrations' },
  );
}
