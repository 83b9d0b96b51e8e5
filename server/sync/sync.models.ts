import { DataTypes, Model, type Sequelize } from 'sequelize';
import type { MutationOp, MutationStatus, SyncEntity } from '../../shared/sync/protocol';

const bigintAsNumber = (key: string) => ({
  get(this: Model): number | null {
    const value = this.getDataValue(key) as unknown;
    return value === null || value === undefined ? null : Number(value);
  },
});

/** The one server-wide revision counter (a single row, id 1), locked by each writing batch. */
export class SyncRevision extends Model {
  declare id: number;
  declare value: number;
}

/** Where each synced record stands: its latest revision, site and whether it is deleted. Pull pages through it. */
export class ChangeLogEntry extends Model {
  declare entity: SyncEntity;
  declare recordId: string;
  declare revision: number;
  declare siteId: string;
  declare isDeleted: boolean;
}

/** A mutation id the server has applied or recorded as a conflict, with its answer. */
export class SyncMutation extends Model {
  declare mutationId: string;
  declare deviceId: string;
  declare userId: string;
  declare entity: SyncEntity;
  declare recordId: string;
  declare status: Exclude<MutationStatus, 'duplicate' | 'rejected'>;
  declare revision: number | null;
  declare conflictId: string | null;
}

/** Both versions of a record that two people changed; a geologist picks or merges. */
export class SyncConflict extends Model {
  declare id: string;
  declare entity: SyncEntity;
  declare recordId: string;
  declare siteId: string;
  declare mutationId: string;
  declare deviceId: string;
  declare userId: string;
  declare baseRevision: number | null;
  declare serverRevision: number;
  declare deviceOp: MutationOp;
  declare deviceData: unknown;
  declare serverData: unknown;
  declare status: 'open' | 'resolved';
  declare resolution: 'server' | 'device' | 'merged' | null;
  declare resolvedById: string | null;
  declare resolvedAt: Date | null;
  declare createdAt: Date;
}

/** The short number a device puts in its human codes, given once per device. */
export class DeviceNumber extends Model {
  declare deviceId: string;
  declare number: number;
  declare userId: string;
}

/** Binds the sync models; called from db/models.ts. */
export function initSyncModels(sequelize: Sequelize): void {
  SyncRevision.init(
    { id: { type: DataTypes.INTEGER, primaryKey: true }, value: { type: DataTypes.BIGINT, allowNull: false, ...bigintAsNumber('value') } },
    { sequelize, tableName: 'sync_revisions' },
  );
  ChangeLogEntry.init(
    {
      entity: { type: DataTypes.STRING(16), primaryKey: true },
      recordId: { type: DataTypes.UUID, primaryKey: true },
      revision: { type: DataTypes.BIGINT, allowNull: false, ...bigintAsNumber('revision') },
      siteId: { type: DataTypes.UUID, allowNull: false },
      isDeleted: { type: DataTypes.BOOLEAN, allowNull: false },
    },
    { sequelize, tableName: 'change_log' },
  );
  SyncMutation.init(
    {
      mutationId: { type: DataTypes.UUID, primaryKey: true },
      deviceId: { type: DataTypes.STRING(64), allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      entity: { type: DataTypes.STRING(16), allowNull: false },
      recordId: { type: DataTypes.UUID, allowNull: false },
      status: { type: DataTypes.STRING(16), allowNull: false },
      revision: { type: DataTypes.BIGINT, allowNull: true, ...bigintAsNumber('revision') },
      conflictId: { type: DataTypes.UUID, allowNull: true },
    },
    { sequelize, tableName: 'sync_mutations' },
  );
  SyncConflict.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      entity: { type: DataTypes.STRING(16), allowNull: false },
      recordId: { type: DataTypes.UUID, allowNull: false },
      siteId: { type: DataTypes.UUID, allowNull: false },
      mutationId: { type: DataTypes.UUID, allowNull: false },
      deviceId: { type: DataTypes.STRING(64), allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      baseRevision: { type: DataTypes.BIGINT, allowNull: true, ...bigintAsNumber('baseRevision') },
      serverRevision: { type: DataTypes.BIGINT, allowNull: false, ...bigintAsNumber('serverRevision') },
      deviceOp: { type: DataTypes.STRING(8), allowNull: false },
      deviceData: { type: DataTypes.JSON, allowNull: true },
      serverData: { type: DataTypes.JSON, allowNull: true },
      status: { type: DataTypes.STRING(16), allowNull: false },
      resolution: { type: DataTypes.STRING(16), allowNull: true },
      resolvedById: { type: DataTypes.UUID, allowNull: true },
      resolvedAt: { type: DataTypes.DATE, allowNull: true },
    },
    { sequelize, tableName: 'sync_conflicts' },
  );
  DeviceNumber.init(
    {
      deviceId: { type: DataTypes.STRING(64), primaryKey: true },
      number: { type: DataTypes.INTEGER, allowNull: false, unique: true },
      userId: { type: DataTypes.UUID, allowNull: false },
    },
    { sequelize, tableName: 'device_numbers' },
  );
}
