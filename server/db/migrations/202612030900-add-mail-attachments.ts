import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * mail_messages.attachments: what the local mail fake received as attachments (the report PDF),
 * as JSON text [{ filename, contentType, size, base64 }], so the Outbox and the tests can open them.
 */
export const migration: MigrationModule = {
  name: '202612030900-add-mail-attachments',
  async up({ context: q }) {
    await q.addColumn('mail_messages', 'attachments', { type: DataTypes.TEXT('long'), allowNull: true });
  },
  async down({ context: q }) {
    await q.removeColumn('mail_messages', 'attachments');
  },
};
