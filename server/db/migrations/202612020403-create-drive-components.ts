import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const num = () => ({ type: DataTypes.DOUBLE, allowNull: true });

/**
 * drive_components: the parts of an engine's drive, unique lower-cased name per engine; and the
 * foreign key from a belt to the component that drives it (the two tables refer to each other).
 */
export const migration: MigrationModule = {
  name: '202612020403-create-drive-components',
  async up({ context: q }) {
    await q.createTable('drive_components', {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'shops', key: 'id' }, onDelete: 'CASCADE' },
      engineId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'engines', key: 'id' }, onDelete: 'CASCADE' },
      position: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING(100), allowNull: false },
      nameKey: { type: DataTypes.STRING(100), allowNull: false },
      kind: {
        type: DataTypes.ENUM('crankshaft', 'alternator', 'water_pump', 'power_steering', 'ac_compressor', 'idler', 'tensioner', 'fan', 'vacuum_pump', 'other'),
        allowNull: false,
      },
      beltId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'belts', key: 'id' }, onDelete: 'SET NULL' },
      pulleyMm: num(),
      backside: { type: DataTypes.BOOLEAN, allowNull: true },
      fixedRatio: num(),
      overrunning: { type: DataTypes.BOOLEAN, allowNull: true },
      designation: { type: DataTypes.STRING(40), allowNull: true },
      balls: { type: DataTypes.INTEGER, allowNull: true },
      ballMm: num(),
      pitchMm: num(),
      contactDeg: num(),
      ftf: num(),
      bpfo: num(),
      bpfi: num(),
      bsf: num(),
      rotatingRing: { type: DataTypes.ENUM('inner', 'outer'), allowNull: true },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    });
    await q.addIndex('drive_components', ['engineId', 'nameKey'], { unique: true, name: 'drive_components_engine_name' });
    await q.addIndex('drive_components', ['shopId', 'designation'], { name: 'drive_components_shop_designation' });
    await q.addConstraint('belts', {
      type: 'foreign key',
      fields: ['driverComponentId'],
      name: 'belts_driver_component_fk',
      references: { table: 'drive_components', field: 'id' },
      onDelete: 'SET NULL',
      onUpdate: 'CASCADE',
    });
  },
  async down({ context: q }) {
    await q.removeConstraint('belts', 'belts_driver_component_fk');
    await q.dropTable('drive_components');
  },
};
