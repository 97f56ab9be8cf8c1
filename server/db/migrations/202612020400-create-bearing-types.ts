import { DataTypes } from 'sequelize';
import { QueryTypes } from 'sequelize';
import { BUILT_IN_BEARINGS, normaliseDesignation } from '../../../shared/drive/bearing-table';
import type { MigrationModule } from '../migrator';

/**
 * bearing_types: each shop's bearings by designation; the designation key is unique per shop.
 * Shops that exist already get the published rows that new shops get at creation.
 */
export const migration: MigrationModule = {
  name: '202612020400-create-bearing-types',
  async up({ context: q }) {
    await q.createTable('bearing_types', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      designation: { type: DataTypes.STRING(40), allowNull: false },
      designationKey: { type: DataTypes.STRING(40), allowNull: false },
      balls: { type: DataTypes.INTEGER, allowNull: false },
      ballMm: { type: DataTypes.DOUBLE, allowNull: false },
      pitchMm: { type: DataTypes.DOUBLE, allowNull: false },
      contactDeg: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      source: { type: DataTypes.ENUM('published', 'measured', 'estimated'), allowNull: false },
      notes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('bearing_types', ['shopId', 'designationKey'], { unique: true, name: 'bearing_types_shop_designation' });
    const shops = await q.sequelize.query<{ id: number }>('SELECT id FROM shops', { type: QueryTypes.SELECT });
    const now = new Date();
    const rows = shops.flatMap((shop) => BUILT_IN_BEARINGS.filter((b) => b.source === 'published').map((b) => ({
      shopId: shop.id, designation: b.designation, designationKey: normaliseDesignation(b.designation), balls: b.balls, ballMm: b.ballMm,
      pitchMm: b.pitchMm, contactDeg: b.contactDeg, source: b.source, notes: b.note, createdAt: now, updatedAt: now,
    })));
    if (rows.length > 0) await q.bulkInsert('bearing_types', rows);
  },
  async down({ context: q }) {
    await q.dropTable('bearing_types');
  },
};
