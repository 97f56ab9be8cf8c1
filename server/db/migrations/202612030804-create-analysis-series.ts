import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * analysis_series: the long series of an analysis as float32 little-endian LONGBLOBs (STYLE.md §6),
 * one row per series (and per envelope band), each at most 4 MiB, written one per statement.
 */
export const migration: MigrationModule = {
  name: '202612030804-create-analysis-series',
  async up({ context: q }) {
    await q.createTable('analysis_series', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      analysisId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'analyses', key: 'id' }, onDelete: 'CASCADE' },
      name: { type: DataTypes.STRING(20), allowNull: false },
      band: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      meta: { type: DataTypes.TEXT, allowNull: false },
      data: { type: DataTypes.BLOB('long'), allowNull: false },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('analysis_series', ['analysisId', 'name', 'band'], { unique: true, name: 'analysis_series_key' });
  },
  async down({ context: q }) {
    await q.dropTable('analysis_series');
  },
};
