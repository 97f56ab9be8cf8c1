import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** case_events: the append-only timeline of a case (who did what and when); `data` is JSON text. */
export const migration: MigrationModule = {
  name: '202612030801-create-case-events',
  async up({ context: q }) {
    await q.createTable('case_events', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      caseId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'cases', key: 'id' }, onDelete: 'CASCADE' },
      actorId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      kind: { type: DataTypes.STRING(24), allowNull: false },
      message: { type: DataTypes.TEXT, allowNull: false },
      note: { type: DataTypes.TEXT, allowNull: true },
      data: { type: DataTypes.TEXT, allowNull: false },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('case_events', ['shopId', 'caseId', 'id'], { name: 'case_events_shop_case' });
  },
  async down({ context: q }) {
    await q.dropTable('case_events');
  },
};
