import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { BEARING_SOURCES, type BearingSource } from '../../shared/schemas/bearings';
import type { Shop } from './shop';

/**
 * A shop's bearing by designation (docs/design.md "Domain model"). `designationKey` is the designation
 * as the kinematics match it (upper case, seal suffix dropped), unique per shop.
 */
export class BearingType extends Model<InferAttributes<BearingType>, InferCreationAttributes<BearingType>> {
  declare id: CreationOptional<number>;
  declare shopId: ForeignKey<Shop['id']>;
  declare designation: string;
  declare designationKey: string;
  declare balls: number;
  declare ballMm: number;
  declare pitchMm: number;
  declare contactDeg: number;
  declare source: BearingSource;
  declare notes: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initBearingType(sequelize: Sequelize): void {
  BearingType.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      designation: { type: DataTypes.STRING(40), allowNull: false },
      designationKey: { type: DataTypes.STRING(40), allowNull: false },
      balls: { type: DataTypes.INTEGER, allowNull: false },
      ballMm: { type: DataTypes.DOUBLE, allowNull: false },
      pitchMm: { type: DataTypes.DOUBLE, allowNull: false },
      contactDeg: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      source: { type: DataTypes.ENUM(...BEARING_SOURCES), allowNull: false },
      notes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'bearing_types' },
  );
}
