import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

/** engines: a shop's engines; the lower-cased name is unique per shop. */
export const migration: MigrationModule = {
  name: '202612020401-create-engines',
  async up({ context: q }) {
    await q.createTable('engines', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      name: { type: DataTypes.STRING(100), allowNull: false },
      nameKey: { type: DataTypes.STRING(100), allowNull: false },
      cylinders: { type: DataTypes.INTEGER, allowNull: false },
      firingOrder: { type: DataTypes.STRING(100), allowNull: false },
      idleRpm: { type: DataTypes.DOUBLE, allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: false },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('engines', ['shopId', 'nameKey'], { unique: true, name: 'engines_shop_name' });
    await q.addIndex('engines', ['shopId', 'updatedAt'], { name: 'engines_shop_updated' });
  },
  async down({ context: q }) {
    await q.dropTable('engines');
  },
};
