import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A phone or computer someone signs in on; its id is made on the device and travels in tokens. */
export class Device extends Model<InferAttributes<Device>, InferCreationAttributes<Device>> {
  declare id: string;
  declare userId: string;
  declare name: string;
  declare lastSeenAt: Date | null;
  declare lastSyncAt: Date | null;
  declare createdAt?: Date;
  declare updatedAt?: Date;
}

export function initDeviceModel(sequelize: Sequelize): void {
  Device.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      userId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.STRING(100), allowNull: false },
      lastSeenAt: { type: DataTypes.DATE, allowNull: true },
      lastSyncAt: { type: DataTypes.DATE, allowNull: true },
    },
    { sequelize, tableName: 'devices' },
  );
}
