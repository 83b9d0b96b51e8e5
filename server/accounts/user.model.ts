import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '../../shared/accounts/roles';
import { recordAttributes } from '../db/record-attributes';

/** A person who signs in. The password hash is null until an invitation is accepted. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: string;
  declare organizationId: string;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare labName: string | null;
  declare passwordHash: string | null;
  declare isDisabled: boolean;
  declare createdAt?: Date;
  declare updatedAt?: Date;
  declare revision?: number;
  declare deletedAt?: Date | null;
}

export function initUserModel(sequelize: Sequelize): void {
  User.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: false },
      email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      role: { type: DataTypes.STRING(16), allowNull: false },
      labName: { type: DataTypes.STRING(200), allowNull: true },
      passwordHash: { type: DataTypes.STRING(100), allowNull: true },
      isDisabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...recordAttributes,
    },
    { sequelize, tableName: 'users', paranoid: true },
  );
}
