import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { RankingEntry } from '../../shared/analysis/types';
import type { DriveDocument } from '../../shared/drive/types';
import type { AnalysisSettings, AnalysisSettingsInput } from '../../shared/schemas/analysis-settings';
import type { AnalysisStage, AnalysisStatus } from '../../shared/schemas/analyses';
import type { Capture } from './capture';
import { jsonText } from './json-text';

/**
 * One pipeline run over a capture, and the job row runners claim (server/jobs/claim.ts): status,
 * progress by stage, attempts, a stable error code, the lease (holder, expiry by the database
 * clock), the resolved settings and the drive document it ran against (a snapshot).
 */
export class Analysis extends Model<InferAttributes<Analysis>, InferCreationAttributes<Analysis>> {
  declare id: CreationOptional<number>;
  declare shopId: number;
  declare captureId: number;
  declare status: AnalysisStatus;
  declare progress: CreationOptional<number>;
  declare stage: AnalysisStage;
  declare attempts: CreationOptional<number>;
  declare errorCode: CreationOptional<string | null>;
  declare errorMessage: CreationOptional<string | null>;
  /** The "this run" tier of the settings (re-analysis); the rest is resolved when the job runs. */
  declare runSettings: AnalysisSettingsInput;
  declare settings: CreationOptional<AnalysisSettings | null>;
  declare driveSnapshot: CreationOptional<DriveDocument | null>;
  declare summary: CreationOptional<Record<string, unknown> | null>;
  declare ranking: CreationOptional<RankingEntry[] | null>;
  declare timingsMs: CreationOptional<Record<string, number> | null>;
  declare leasedBy: CreationOptional<string | null>;
  declare leaseExpiresAt: CreationOptional<Date | null>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare capture?: NonAttribute<Capture>;
}

export function initAnalysis(sequelize: Sequelize): void {
  Analysis.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false },
      captureId: { type: DataTypes.INTEGER, allowNull: false },
      status: { type: DataTypes.STRING(10), allowNull: false },
      progress: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      stage: { type: DataTypes.STRING(16), allowNull: false },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      errorCode: { type: DataTypes.STRING(40), allowNull: true },
      errorMessage: { type: DataTypes.TEXT, allowNull: true },
      runSettings: jsonText('runSettings'),
      settings: jsonText('settings', { allowNull: true }),
      driveSnapshot: jsonText('driveSnapshot', { allowNull: true, long: true }),
      summary: jsonText('summary', { allowNull: true, long: true }),
      ranking: jsonText('ranking', { allowNull: true, long: true }),
      timingsMs: jsonText('timingsMs', { allowNull: true }),
      leasedBy: { type: DataTypes.STRING(100), allowNull: true },
      leaseExpiresAt: { type: DataTypes.DATE(3), allowNull: true },
      startedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'analyses' },
  );
}
