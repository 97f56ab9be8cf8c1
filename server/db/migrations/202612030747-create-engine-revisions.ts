import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** engine_revisions: one row per save of an engine — who, when, and what changed (JSON list, before → after). */
export const migration: MigrationModule = {
  name: '202612030747-create-engine-revisions',
  async up({ context: q }) {
    await q.createTable('engine_revisions', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      engineId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'engines', key: 'id' }, onDelete: 'CASCADE' },
      version: { type: DataTypes.INTEGER, allowNull: false },
      userId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      userName: { type: DataTypes.STRING(100), allowNull: false },
      action: { type: DataTypes.STRING(20), allowNull: false },
      changes: { type: DataTypes.TEXT('medium'), allowNull: false },
      createdAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('engine_revisions', ['shopId', 'engineId', 'version'], { name: 'engine_revisions_engine' });
  },
  async down({ context: q }) {
    await q.dropTable('engine_revisions');
  },
};
