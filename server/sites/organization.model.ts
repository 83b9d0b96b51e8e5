import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { recordAttributes } from '../db/record-attributes';

/** A cooperative or company that runs one or more sites. */
export class Organization extends Model<InferAttributes<Organization>, InferCreationAttributes<Organization>> {
  declare id: string;
  declare name: string;
  declare createdAt?: Date;
  declare updatedAt?: Date;
  declare revision?: number;
  declare deletedAt?: Date | null;
}

export function initOrganizationModel(sequelize: Sequelize): void {
  Organization.init(
    { id: { type: DataTypes.UUID, primaryKey: true }, name: { type: DataTypes.STRING(200), allowNull: false }, ...recordAttributes },
    { sequelize, tableName: 'organizations', paranoid: true },
  );
}
