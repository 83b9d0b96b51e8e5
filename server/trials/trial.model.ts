import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { recordAttributes } from '../db/record-attributes';

/** Whether a trial counts towards the site's working recovery. */
export type TrialStatus = 'accepted' | 'pending' | 'rejected';

/** The statuses a trial may have, in the order the screen offers them. */
export const TRIAL_STATUSES: readonly TrialStatus[] = ['accepted', 'pending', 'rejected'];

/** A test run over the table or concentrator (DESIGN §4 `Trial`, field names of §6). */
export class Trial extends Model<InferAttributes<Trial>, InferCreationAttributes<Trial>> {
  declare id: string;
  declare siteId: string;
  declare pileIds: string[];
  /** Day of the run, YYYY-MM-DD. */
  declare trialDate: string;
  declare equipmentNote: string;
  declare feedMassKg: number;
  declare feedGradeGpt: number;
  declare concentrateMassKg: number;
  declare concentrateGradeGpt: number;
  declare tailingsGradeGpt: number;
  declare middlingsMassKg: number | null;
  declare middlingsGradeGpt: number | null;
  declare status: TrialStatus;
  declare createdById: string;
  declare createdAt?: Date;
  declare updatedAt?: Date;
  declare revision?: number;
  declare deletedAt?: Date | null;
}

export function initTrialModel(sequelize: Sequelize): void {
  Trial.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      pileIds: { type: DataTypes.JSON, allowNull: false },
      trialDate: { type: DataTypes.STRING(10), allowNull: false },
      equipmentNote: { type: DataTypes.TEXT, allowNull: false },
      feedMassKg: { type: DataTypes.DOUBLE, allowNull: false },
      feedGradeGpt: { type: DataTypes.DOUBLE, allowNull: false },
      concentrateMassKg: { type: DataTypes.DOUBLE, allowNull: false },
      concentrateGradeGpt: { type: DataTypes.DOUBLE, allowNull: false },
      tailingsGradeGpt: { type: DataTypes.DOUBLE, allowNull: false },
      middlingsMassKg: { type: DataTypes.DOUBLE, allowNull: true },
      middlingsGradeGpt: { type: DataTypes.DOUBLE, allowNull: true },
      status: { type: DataTypes.STRING(16), allowNull: false },
      createdById: { type: DataTypes.UUID, allowNull: false },
      ...recordAttributes,
      deletedAt: { type: DataTypes.DATE, allowNull: true },
    },
    { sequelize, tableName: 'trials', paranoid: true },
  );
}
