import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * drive_components: the outside diameter as measured (the effective one stays in pulleyMm) and
 * where an entered bearing geometry comes from (published / measured / estimated).
 */
export const migration: MigrationModule = {
  name: '202612030748-add-component-measured',
  async up({ context: q }) {
    await q.addColumn('drive_components', 'outsideMm', { type: DataTypes.DOUBLE, allowNull: true });
    await q.addColumn('drive_components', 'bearingSource', { type: DataTypes.ENUM('published', 'measured', 'estimated'), allowNull: true });
  },
  async down({ context: q }) {
    await q.removeColumn('drive_components', 'bearingSource');
    await q.removeColumn('drive_components', 'outsideMm');
  },
};
