import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A tenant: every other record belongs to exactly one shop. */
export class Shop extends Model<InferAttributes<Shop>, InferCreationAttributes<Shop>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare isDemo: CreationOptional<boolean>;
  declare address: CreationOptional<string>;
  declare phone: CreationOptional<string>;
  declare defaultLeadId: CreationOptional<number | null>;
  declare serviceAdvisorEmail: CreationOptional<string>;
  /** JSON text of ShopAnalysisDefaults; null = the AnalysisSettingsSchema defaults. */
  declare analysisDefaults: CreationOptional<string | null>;
  declare groovedOffsetMm: CreationOptional<number>;
  declare backsideOffsetMm: CreationOptional<number>;
  declare pulleyUnit: CreationOptional<'mm' | 'inch'>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initShop(sequelize: Sequelize): void {
  Shop.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(100), allowNull: false },
      isDemo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      address: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
      phone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
      defaultLeadId: { type: DataTypes.INTEGER, allowNull: true },
      serviceAdvisorEmail: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
      analysisDefaults: { type: DataTypes.TEXT, allowNull: true },
      groovedOffsetMm: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 2 },
      backsideOffsetMm: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 3 },
      pulleyUnit: { type: DataTypes.ENUM('mm', 'inch'), allowNull: false, defaultValue: 'mm' },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'shops' },
  );
}
