import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * analyses: one pipeline run over a capture, and the job row the runners claim (status, lease,
 * attempts). Summaries are JSON text; long series live in analysis_series. The claim query reads
 * (status, leaseExpiresAt, id), hence the index.
 */
export const migration: MigrationModule = {
  name: '202612030803-create-analyses',
  async up({ context: q }) {
    await q.createTable('analyses', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      captureId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'captures', key: 'id' }, onDelete: 'CASCADE' },
      status: { type: DataTypes.STRING(10), allowNull: false },
      progress: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      stage: { type: DataTypes.STRING(16), allowNull: false },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      errorCode: { type: DataTypes.STRING(40), allowNull: true },
      errorMessage: { type: DataTypes.TEXT, allowNull: true },
      runSettings: { type: DataTypes.TEXT, allowNull: false },
      settings: { type: DataTypes.TEXT, allowNull: true },
      driveSnapshot: { type: DataTypes.TEXT('long'), allowNull: true },
      summary: { type: DataTypes.TEXT('long'), allowNull: true },
      ranking: { type: DataTypes.TEXT('long'), allowNull: true },
      timingsMs: { type: DataTypes.TEXT, allowNull: true },
      leasedBy: { type: DataTypes.STRING(100), allowNull: true },
      leaseExpiresAt: { type: DataTypes.DATE(3), allowNull: true },
      startedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('analyses', ['status', 'leaseExpiresAt', 'id'], { name: 'analyses_claim' });
    await q.addIndex('analyses', ['shopId', 'status', 'id'], { name: 'analyses_shop_status' });
  },
  async down({ context: q }) {
    await q.dropTable('analyses');
  },
};
