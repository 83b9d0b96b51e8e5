import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A run of sample-code sequence numbers reserved for one printed label sheet. The codes are
 * `SITE-DEVICE-SEQ` with the site's label number as DEVICE, so no phone ever counts into them.
 */
export class LabelRange extends Model<InferAttributes<LabelRange>, InferCreationAttributes<LabelRange>> {
  declare id: string;
  declare siteId: string;
  /** The device number the site's label sheets print under (from the shared device-number table). */
  declare deviceNumber: number;
  declare firstSequence: number;
  declare lastSequence: number;
  declare printedById: string;
  declare createdAt?: Date;
  declare updatedAt?: Date;
}

export function initLabelRangeModel(sequelize: Sequelize): void {
  LabelRange.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      siteId: { type: DataTypes.UUID, allowNull: false },
      deviceNumber: { type: DataTypes.INTEGER, allowNull: false },
      firstSequence: { type: DataTypes.INTEGER, allowNull: false },
      lastSequence: { type: DataTypes.INTEGER, allowNull: false },
      printedById: { type: DataTypes.UUID, allowNull: false },
    },
    { sequelize, tableName: 'label_ranges' },
  );
}
