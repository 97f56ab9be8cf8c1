import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** password_resets: one-time reset links (sha256 of the token stored), one hour by default. */
export const migration: MigrationModule = {
  name: '202612020304-create-password-resets',
  async up({ context: q }) {
    await q.createTable('password_resets', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      userId: {
        type: DataTypes.INTEGER,
        allowNull: false,
        references: { model: 'users', key: 'id' },
        onDelete: 'CASCADE',
      },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
  },
  async down({ context: q }) {
    await q.dropTable('password_resets');
  },
};
