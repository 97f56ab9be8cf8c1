import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** users: one shop each; e-mail unique across shops because sign-in is by e-mail alone. */
export const migration: MigrationModule = {
  name: '202612020301-create-users',
  async up({ context: q }) {
    await q.createTable('users', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: {
        type: DataTypes.INTEGER,
        allowNull: false,
        references: { model: 'shops', key: 'id' },
        onDelete: 'CASCADE',
      },
      email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(100), allowNull: false },
      role: { type: DataTypes.ENUM('tech', 'specialist', 'lead', 'admin'), allowNull: false },
      passwordHash: { type: DataTypes.STRING(100), allowNull: false },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('users', ['shopId']);
  },
  async down({ context: q }) {
    await q.dropTable('users');
  },
};
