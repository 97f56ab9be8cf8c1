import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/**
 * belts: an engine's belts; the lower-cased name is unique per engine. The driver's foreign key
 * is added by the drive-components migration, since that table does not exist yet.
 */
export const migration: MigrationModule = {
  name: '202612020402-create-belts',
  async up({ context: q }) {
    await q.createTable('belts', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      engineId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'engines', key: 'id' }, onDelete: 'CASCADE' },
      position: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING(100), allowNull: false },
      nameKey: { type: DataTypes.STRING(100), allowNull: false },
      lengthMm: { type: DataTypes.DOUBLE, allowNull: false },
      driverComponentId: { type: DataTypes.INTEGER, allowNull: true },
      driverPulleyMm: { type: DataTypes.DOUBLE, allowNull: false },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('belts', ['engineId', 'nameKey'], { unique: true, name: 'belts_engine_name' });
  },
  async down({ context: q }) {
    await q.dropTable('belts');
  },
};
