import {
  DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes,
  type NonAttribute, type Sequelize,
} from 'sequelize';
import type { Belt } from './belt';
import type { DriveComponent } from './drive-component';
import type { Shop } from './shop';

/**
 * A shop's engine and the head of its drive document. The firing order is stored as text
 * ("1-3-4-2"); `nameKey` is the lower-cased name, unique per shop.
 */
export class Engine extends Model<InferAttributes<Engine>, InferCreationAttributes<Engine>> {
  declare id: CreationOptional<number>;
  declare shopId: ForeignKey<Shop['id']>;
  declare name: string;
  declare nameKey: string;
  declare cylinders: number;
  declare firingOrder: string;
  declare idleRpm: number | null;
  declare notes: string;
  /** Raised by every write; a write that names an older version is refused (409 `stale_write`). */
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare belts?: NonAttribute<Belt[]>;
  declare components?: NonAttribute<DriveComponent[]>;
}

export function initEngine(sequelize: Sequelize): void {
  Engine.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(100), allowNull: false },
      nameKey: { type: DataTypes.STRING(100), allowNull: false },
      cylinders: { type: DataTypes.INTEGER, allowNull: false },
      firingOrder: { type: DataTypes.STRING(100), allowNull: false },
      idleRpm: { type: DataTypes.DOUBLE, allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: false },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'engines' },
  );
}
