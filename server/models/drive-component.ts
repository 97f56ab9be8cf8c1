import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ComponentKind, RotatingRing } from '../../shared/drive/types';
import { COMPONENT_KINDS } from '../../shared/drive-io/component-table';
import type { Belt } from './belt';
import type { Engine } from './engine';
import type { Shop } from './shop';

/**
 * One part of an engine's drive (DESIGN.md "DriveComponent"). Its bearing is a designation (a row
 * of the shop's BearingType table, matched by `designation`), geometry, or entered factors; every
 * bearing column is null when the bearing is unknown. Null booleans mean "not given".
 */
export class DriveComponent extends Model<InferAttributes<DriveComponent>, InferCreationAttributes<DriveComponent>> {
  declare id: CreationOptional<number>;
  declare shopId: ForeignKey<Shop['id']>;
  declare engineId: ForeignKey<Engine['id']>;
  declare position: number;
  declare name: string;
  declare nameKey: string;
  declare kind: ComponentKind;
  declare beltId: ForeignKey<Belt['id']> | null;
  declare pulleyMm: number | null;
  /** Outside diameter as measured (mm); the effective one used for ratios is pulleyMm. */
  declare outsideMm: CreationOptional<number | null>;
  declare backside: boolean | null;
  declare fixedRatio: number | null;
  declare overrunning: boolean | null;
  declare designation: string | null;
  declare balls: number | null;
  declare ballMm: number | null;
  declare pitchMm: number | null;
  declare contactDeg: number | null;
  declare ftf: number | null;
  declare bpfo: number | null;
  declare bpfi: number | null;
  declare bsf: number | null;
  declare rotatingRing: RotatingRing | null;
  declare bearingSource: CreationOptional<'published' | 'measured' | 'estimated' | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initDriveComponent(sequelize: Sequelize): void {
  // A fresh object per attribute: Sequelize writes the column name into it.
  const num = () => ({ type: DataTypes.DOUBLE, allowNull: true });
  DriveComponent.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      position: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING(100), allowNull: false },
      nameKey: { type: DataTypes.STRING(100), allowNull: false },
      kind: { type: DataTypes.ENUM(...COMPONENT_KINDS), allowNull: false },
      pulleyMm: num(),
      outsideMm: num(),
      backside: { type: DataTypes.BOOLEAN, allowNull: true },
      fixedRatio: num(),
      overrunning: { type: DataTypes.BOOLEAN, allowNull: true },
      designation: { type: DataTypes.STRING(40), allowNull: true },
      balls: { type: DataTypes.INTEGER, allowNull: true },
      ballMm: num(),
      pitchMm: num(),
      contactDeg: num(),
      ftf: num(),
      bpfo: num(),
      bpfi: num(),
      bsf: num(),
      rotatingRing: { type: DataTypes.ENUM('inner', 'outer'), allowNull: true },
      bearingSource: { type: DataTypes.ENUM('published', 'measured', 'estimated'), allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'drive_components' },
  );
}
