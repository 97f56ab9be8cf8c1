import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * shops: the Shop setup fields (issue 17 item 11): report header (address, phone), the default
 * lead for new cases, the service advisor's e-mail, run-level analysis defaults (JSON text, parsed
 * through ShopAnalysisDefaultsSchema), the measured-diameter offsets and the pulley unit.
 */
export const migration: MigrationModule = {
  name: '202612030745-add-shop-settings',
  async up({ context: q }) {
    await q.addColumn('shops', 'address', { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' });
    await q.addColumn('shops', 'phone', { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' });
    await q.addColumn('shops', 'defaultLeadId', {
      type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL',
    });
    await q.addColumn('shops', 'serviceAdvisorEmail', { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' });
    await q.addColumn('shops', 'analysisDefaults', { type: DataTypes.TEXT, allowNull: true });
    await q.addColumn('shops', 'groovedOffsetMm', { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 2 });
    await q.addColumn('shops', 'backsideOffsetMm', { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 3 });
    await q.addColumn('shops', 'pulleyUnit', { type: DataTypes.ENUM('mm', 'inch'), allowNull: false, defaultValue: 'mm' });
  },
  async down({ context: q }) {
    for (const column of ['pulleyUnit', 'backsideOffsetMm', 'groovedOffsetMm', 'analysisDefaults', 'serviceAdvisorEmail', 'defaultLeadId', 'phone', 'address']) {
      await q.removeColumn('shops', column);
    }
  },
};
