import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** engines.version: an integer raised by every write, for optimistic concurrency (409 `stale_write`). */
export const migration: MigrationModule = {
  name: '202612030746-add-engine-version',
  async up({ context: q }) {
    await q.addColumn('engines', 'version', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 });
  },
  async down({ context: q }) {
    await q.removeColumn('engines', 'version');
  },
};
