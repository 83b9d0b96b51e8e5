import { DataTypes } from 'sequelize';

/** Model attributes matching `recordColumns` in the migrations (the timestamps Sequelize fills itself). */
export const recordAttributes = {
  revision: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0, get(this: { getDataValue(key: string): unknown }) {
    return Number(this.getDataValue('revision'));
  } },
};
