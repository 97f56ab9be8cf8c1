import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** bearing_types: each shop's bearings by designation; the designation key is unique per shop. */
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
  },
  async down({ context: q }) {
    await q.dropTable('bearing_types');
  },
};
