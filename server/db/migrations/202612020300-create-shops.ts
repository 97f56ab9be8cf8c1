import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** shops: the tenants. `isDemo` marks the invented demo shop so DEMO=off touches nothing else. */
export const migration: MigrationModule = {
  name: '202612020300-create-shops',
  async up({ context: q }) {
    await q.createTable('shops', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(100), allowNull: false },
      isDemo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
  },
  async down({ context: q }) {
    await q.dropTable('shops');
  },
};
