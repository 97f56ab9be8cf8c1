import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * captures: an uploaded file of a case. `storageKey` is chosen by the server (unique);
 * `originalName` is cleaned and for display only; `metadata` is the upload contract's JSON;
 * `currentAnalysisId` points at the latest run (no foreign key: the two tables point at each other).
 */
export const migration: MigrationModule = {
  name: '202612030802-create-captures',
  async up({ context: q }) {
    await q.createTable('captures', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      caseId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'cases', key: 'id' }, onDelete: 'CASCADE' },
      uploadedById: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      originalName: { type: DataTypes.STRING(255), allowNull: false },
      format: { type: DataTypes.STRING(8), allowNull: false },
      byteSize: { type: DataTypes.BIGINT, allowNull: false },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      storageKey: { type: DataTypes.STRING(200), allowNull: false, unique: true },
      sampleRateHz: { type: DataTypes.DOUBLE, allowNull: true },
      channelCount: { type: DataTypes.INTEGER, allowNull: true },
      durationS: { type: DataTypes.DOUBLE, allowNull: true },
      phase: { type: DataTypes.STRING(16), allowNull: false },
      metadata: { type: DataTypes.TEXT, allowNull: false },
      currentAnalysisId: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('captures', ['shopId', 'caseId'], { name: 'captures_shop_case' });
  },
  async down({ context: q }) {
    await q.dropTable('captures');
  },
};
