import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** mail_messages: what the local mail fake received (development and tests); shopId when known. */
export const migration: MigrationModule = {
  name: '202612020305-create-mail-messages',
  async up({ context: q }) {
    await q.createTable('mail_messages', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: {
        type: DataTypes.INTEGER,
        allowNull: true,
        references: { model: 'shops', key: 'id' },
        onDelete: 'SET NULL',
      },
      to: { type: DataTypes.STRING(1000), allowNull: false },
      from: { type: DataTypes.STRING(1000), allowNull: false },
      subject: { type: DataTypes.STRING(1000), allowNull: false },
      text: { type: DataTypes.TEXT('medium'), allowNull: false },
      html: { type: DataTypes.TEXT('medium'), allowNull: true },
      createdAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('mail_messages', ['shopId', 'createdAt']);
  },
  async down({ context: q }) {
    await q.dropTable('mail_messages');
  },
};
