import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * ratio_calibrations: effective-ratio corrections a lead accepted for a part of an engine (issue
 * 20 item 3), one row per (engine, part); later rankings move and narrow that part's windows.
 */
export const migration: MigrationModule = {
  name: '202612030900-create-ratio-calibrations',
  async up({ context: q }) {
    await q.createTable('ratio_calibrations', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      engineId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'engines', key: 'id' }, onDelete: 'CASCADE' },
      componentKey: { type: DataTypes.STRING(100), allowNull: false },
      component: { type: DataTypes.STRING(100), allowNull: false },
      factor: { type: DataTypes.DOUBLE, allowNull: false },
      uncertainty: { type: DataTypes.DOUBLE, allowNull: false },
      captures: { type: DataTypes.INTEGER, allowNull: false },
      cases: { type: DataTypes.INTEGER, allowNull: false },
      acceptedById: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('ratio_calibrations', ['shopId', 'engineId', 'componentKey'], { unique: true, name: 'ratio_calibrations_key' });
  },
  async down({ context: q }) {
    await q.dropTable('ratio_calibrations');
  },
};
