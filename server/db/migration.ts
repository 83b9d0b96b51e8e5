import { DataTypes, type QueryInterface } from 'sequelize';

/** One schema step. `dialect` is passed for the rare place where SQLite and PostgreSQL differ. */
export interface Migration {
  readonly name: string;
  up(queryInterface: QueryInterface, dialect: 'sqlite' | 'postgres'): Promise<void>;
  down(queryInterface: QueryInterface, dialect: 'sqlite' | 'postgres'): Promise<void>;
}

/**
 * Columns every synced or audited record carries (DESIGN §4): timestamps, the server revision of
 * its last change, and a soft-delete mark so deletions travel through sync like any other change.
 */
export const recordColumns = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
  revision: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
  deletedAt: { type: DataTypes.DATE, allowNull: true },
};
