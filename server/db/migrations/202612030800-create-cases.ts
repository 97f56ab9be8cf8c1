import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * cases: one repair order of a shop (DESIGN.md "Case"). `vehicle` and `confirmed` are JSON text;
 * `searchText` is the lower-cased RO number, vehicle and complaint the list's search reads;
 * `version` is the optimistic-concurrency counter of PATCH.
 */
export const migration: MigrationModule = {
  name: '202612030800-create-cases',
  async up({ context: q }) {
    await q.createTable('cases', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      roNumber: { type: DataTypes.STRING(40), allowNull: false },
      vehicle: { type: DataTypes.TEXT, allowNull: false },
      engineId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'engines', key: 'id' }, onDelete: 'SET NULL' },
      complaint: { type: DataTypes.TEXT, allowNull: false },
      technicianId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      leadId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      createdById: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      advisorName: { type: DataTypes.STRING(100), allowNull: false, defaultValue: '' },
      advisorEmail: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
      status: { type: DataTypes.STRING(12), allowNull: false },
      confirmed: { type: DataTypes.TEXT, allowNull: true },
      searchText: { type: DataTypes.TEXT, allowNull: false },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('cases', ['shopId', 'updatedAt'], { name: 'cases_shop_updated' });
    await q.addIndex('cases', ['shopId', 'status'], { name: 'cases_shop_status' });
    await q.addIndex('cases', ['shopId', 'engineId'], { name: 'cases_shop_engine' });
  },
  async down({ context: q }) {
    await q.dropTable('cases');
  },
};
