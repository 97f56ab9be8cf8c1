import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * findings: the ranked suspects of a case, one row per (component, fault), kept across re-ranks
 * so dismissals and notes survive; `inRanking` says whether the latest ranking still lists it.
 * `captures` is the JSON of the matched lines per capture.
 */
export const migration: MigrationModule = {
  name: '202612030805-create-findings',
  async up({ context: q }) {
    await q.createTable('findings', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      caseId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'cases', key: 'id' }, onDelete: 'CASCADE' },
      componentKey: { type: DataTypes.STRING(100), allowNull: false },
      component: { type: DataTypes.STRING(100), allowNull: false },
      target: { type: DataTypes.STRING(12), allowNull: false },
      fault: { type: DataTypes.STRING(12), allowNull: false },
      rank: { type: DataTypes.INTEGER, allowNull: false },
      score: { type: DataTypes.DOUBLE, allowNull: false },
      order: { type: DataTypes.DOUBLE, allowNull: false },
      nominalOrder: { type: DataTypes.DOUBLE, allowNull: false },
      slipPct: { type: DataTypes.DOUBLE, allowNull: true },
      evidence: { type: DataTypes.TEXT, allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: false },
      indistinguishableFrom: { type: DataTypes.TEXT, allowNull: false },
      approximate: { type: DataTypes.BOOLEAN, allowNull: false },
      engineBorn: { type: DataTypes.BOOLEAN, allowNull: false },
      captures: { type: DataTypes.TEXT('long'), allowNull: false },
      afterRepairScore: { type: DataTypes.DOUBLE, allowNull: true },
      inRanking: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      status: { type: DataTypes.STRING(12), allowNull: false },
      decidedById: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
      decidedAt: { type: DataTypes.DATE(3), allowNull: true },
      note: { type: DataTypes.TEXT, allowNull: true },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    });
    await q.addIndex('findings', ['caseId', 'componentKey', 'fault'], { unique: true, name: 'findings_case_key' });
    await q.addIndex('findings', ['shopId', 'caseId'], { name: 'findings_shop_case' });
  },
  async down({ context: q }) {
    await q.dropTable('findings');
  },
};
