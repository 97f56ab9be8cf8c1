import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { DriveComponent } from './drive-component';
import type { Engine } from './engine';
import type { Shop } from './shop';

/**
 * A belt of an engine's drive: its length and the component whose groove (of effective diameter
 * `driverPulleyMm`) drives it. `position` keeps the document's order.
 */
export class Belt extends Model<InferAttributes<Belt>, InferCreationAttributes<Belt>> {
  declare id: CreationOptional<number>;
  declare shopId: ForeignKey<Shop['id']>;
  declare engineId: ForeignKey<Engine['id']>;
  declare position: number;
  declare name: string;
  declare nameKey: string;
  declare lengthMm: number;
  declare driverComponentId: ForeignKey<DriveComponent['id']> | null;
  declare driverPulleyMm: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initBelt(sequelize: Sequelize): void {
  Belt.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      position: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING(100), allowNull: false },
      nameKey: { type: DataTypes.STRING(100), allowNull: false },
      lengthMm: { type: DataTypes.DOUBLE, allowNull: false },
      driverPulleyMm: { type: DataTypes.DOUBLE, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'belts' },
  );
}
