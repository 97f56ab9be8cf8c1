import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { jsonText } from './json-text';

/** One long series of an analysis: float32 little-endian samples in a LONGBLOB, plus what they mean (`meta`). */
export class AnalysisSeries extends Model<InferAttributes<AnalysisSeries>, InferCreationAttributes<AnalysisSeries>> {
  declare id: CreationOptional<number>;
  declare analysisId: number;
  declare name: string;
  declare band: CreationOptional<number>;
  declare meta: Record<string, unknown>;
  declare data: Buffer;
  declare createdAt: CreationOptional<Date>;
}

export function initAnalysisSeries(sequelize: Sequelize): void {
  AnalysisSeries.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      analysisId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING(20), allowNull: false },
      band: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      meta: jsonText('meta'),
      data: { type: DataTypes.BLOB('long'), allowNull: false },
      createdAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'analysis_series', updatedAt: false },
  );
}
