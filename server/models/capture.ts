import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { CaptureMetadata, CapturePhase } from '../../shared/schemas/captures';
import { jsonText } from './json-text';
import type { User } from './user';

/** An uploaded file of a case (DESIGN.md "Capture"); the file itself is in storage under `storageKey`. */
export class Capture extends Model<InferAttributes<Capture>, InferCreationAttributes<Capture>> {
  declare id: CreationOptional<number>;
  declare shopId: number;
  declare caseId: number;
  declare uploadedById: number | null;
  declare originalName: string;
  declare format: 'wav' | 'csv';
  declare byteSize: number;
  declare sha256: string;
  declare storageKey: string;
  declare sampleRateHz: number | null;
  declare channelCount: number | null;
  declare durationS: number | null;
  declare phase: CapturePhase;
  declare metadata: CaptureMetadata;
  declare currentAnalysisId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare uploadedBy?: NonAttribute<User | null>;
}

export function initCapture(sequelize: Sequelize): void {
  Capture.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false },
      caseId: { type: DataTypes.INTEGER, allowNull: false },
      uploadedById: { type: DataTypes.INTEGER, allowNull: true },
      originalName: { type: DataTypes.STRING(255), allowNull: false },
      format: { type: DataTypes.STRING(8), allowNull: false },
      byteSize: { type: DataTypes.BIGINT, allowNull: false, get(this: Capture) { return Number(this.getDataValue('byteSize')); } },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      storageKey: { type: DataTypes.STRING(200), allowNull: false },
      sampleRateHz: { type: DataTypes.DOUBLE, allowNull: true },
      channelCount: { type: DataTypes.INTEGER, allowNull: true },
      durationS: { type: DataTypes.DOUBLE, allowNull: true },
      phase: { type: DataTypes.STRING(16), allowNull: false },
      metadata: jsonText('metadata'),
      currentAnalysisId: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'captures' },
  );
}
