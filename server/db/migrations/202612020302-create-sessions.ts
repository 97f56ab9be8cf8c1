import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** sessions: connect-session-sequelize's table, plus userId so a deactivated user's sessions can be ended. */
export const migration: MigrationModule = {
  name: '202612020302-create-sessions',
  async up({ context: q }) {
    await q.createTable('sessions', {
      sid: { type: DataTypes.STRING(64), primaryKey: true },
      expires: { type: DataTypes.DATE, allowNull: true },
      data: { type: DataTypes.TEXT, allowNull: true },
      userId: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('sessions', ['userId']);
    await q.addIndex('sessions', ['expires']);
  },
  async down({ context: q }) {
    await q.dropTable('sessions');
  },
};
