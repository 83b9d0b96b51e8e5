import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** That a user belongs to a site: the only way to see that site's data. */
export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: string;
  declare userId: string;
  declare siteId: string;
  declare createdAt?: Date;
  declare updatedAt?: Date;
}

export function initMembershipModel(sequelize: Sequelize): void {
  Membership.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      userId: { type: DataTypes.UUID, allowNull: false },
      siteId: { type: DataTypes.UUID, allowNull: false },
    },
    { sequelize, tableName: 'memberships' },
  );
}
