import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Engine } from './engine';
import type { Shop } from './shop';

/**
 * One save of an engine (edit history): the version it produced, who saved it (the name is kept
 * so the history still reads after the user is removed), and the changes as JSON text
 * (`EngineChange[]`, shared/drive-io/engine-diff.ts).
 */
export class EngineRevision extends Model<InferAttributes<EngineRevision>, InferCreationAttributes<EngineRevision>> {
  declare id: CreationOptional<number>;
  declare shopId: ForeignKey<Shop['id']>;
  declare engineId: ForeignKey<Engine['id']>;
  declare version: number;
  declare userId: number | null;
  declare userName: string;
  declare action: 'create' | 'update' | 'import' | 'duplicate';
  declare changes: string;
  declare createdAt: CreationOptional<Date>;
}

export function initEngineRevision(sequelize: Sequelize): void {
  EngineRevision.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      version: { type: DataTypes.INTEGER, allowNull: false },
      userId: { type: DataTypes.INTEGER, allowNull: true },
      userName: { type: DataTypes.STRING(100), allowNull: false },
      action: { type: DataTypes.STRING(20), allowNull: false },
      changes: { type: DataTypes.TEXT('medium'), allowNull: false },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'engine_revisions', updatedAt: false },
  );
}
