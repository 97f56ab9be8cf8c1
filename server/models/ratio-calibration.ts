import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** An accepted effective-ratio correction of one part of an engine (issue 20 item 3). */
export class RatioCalibration extends Model<InferAttributes<RatioCalibration>, InferCreationAttributes<RatioCalibration>> {
  declare id: CreationOptional<number>;
  declare shopId: number;
  declare engineId: number;
  declare componentKey: string;
  declare component: string;
  /** Effective / nominal ratio. */
  declare factor: number;
  /** Its ± (case-to-case scatter) as a fraction. */
  declare uncertainty: number;
  declare captures: number;
  declare cases: number;
  declare acceptedById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initRatioCalibration(sequelize: Sequelize): void {
  RatioCalibration.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false },
      engineId: { type: DataTypes.INTEGER, allowNull: false },
      componentKey: { type: DataTypes.STRING(100), allowNull: false },
      component: { type: DataTypes.STRING(100), allowNull: false },
      factor: { type: DataTypes.DOUBLE, allowNull: false },
      uncertainty: { type: DataTypes.DOUBLE, allowNull: false },
      captures: { type: DataTypes.INTEGER, allowNull: false },
      cases: { type: DataTypes.INTEGER, allowNull: false },
      acceptedById: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'ratio_calibrations' },
  );
}
