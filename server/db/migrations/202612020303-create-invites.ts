import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** invites: one-time links that create a user in a shop; only the sha256 of the token is stored. */
export const migration: MigrationModule = {
  name: '202612020303-create-invites',
  async up({ context: q }) {
    await q.createTable('invites', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: {
        type: DataTypes.INTEGER,
        allowNull: false,
        references: { model: 'shops', key: 'id' },
        onDelete: 'CASCADE',
      },
      email: { type: DataTypes.STRING(254), allowNull: false },
      role: { type: DataTypes.ENUM('tech', 'specialist', 'lead', 'admin'), allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      invitedById: {
        type: DataTypes.INTEGER,
        allowNull: true,
        references: { model: 'users', key: 'id' },
        onDelete: 'SET NULL',
      },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      acceptedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('invites', ['shopId']);
  },
  async down({ context: q }) {
    await q.dropTable('invites');
  },
};
