import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { FindingCaptureDto, FindingStatus } from '../../shared/schemas/analyses';
import { jsonText } from './json-text';
import type { User } from './user';

/**
 * A ranked suspect of a case, one row per (component, fault), kept across re-ranks so that a
 * dismissal or a note stays with its suspect; `inRanking` is false once a re-rank drops it.
 */
export class Finding extends Model<InferAttributes<Finding>, InferCreationAttributes<Finding>> {
  declare id: CreationOptional<number>;
  declare shopId: number;
  declare caseId: number;
  declare componentKey: string;
  declare component: string;
  declare target: 'component' | 'belt';
  declare fault: 'shaft' | 'outer_race' | 'inner_race' | 'ball' | 'cage' | 'belt';
  declare rank: number;
  declare score: number;
  declare order: number;
  declare nominalOrder: number;
  declare slipPct: number | null;
  declare evidence: string;
  declare notes: string[];
  declare indistinguishableFrom: string[];
  declare approximate: boolean;
  declare engineBorn: boolean;
  declare captures: FindingCaptureDto[];
  declare afterRepairScore: number | null;
  declare inRanking: CreationOptional<boolean>;
  declare status: FindingStatus;
  declare decidedById: CreationOptional<number | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare note: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare decidedBy?: NonAttribute<User | null>;
}

export function initFinding(sequelize: Sequelize): void {
  Finding.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false },
      caseId: { type: DataTypes.INTEGER, allowNull: false },
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
      notes: jsonText('notes'),
      indistinguishableFrom: jsonText('indistinguishableFrom'),
      approximate: { type: DataTypes.BOOLEAN, allowNull: false },
      engineBorn: { type: DataTypes.BOOLEAN, allowNull: false },
      captures: jsonText('captures', { long: true }),
      afterRepairScore: { type: DataTypes.DOUBLE, allowNull: true },
      inRanking: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      status: { type: DataTypes.STRING(12), allowNull: false },
      decidedById: { type: DataTypes.INTEGER, allowNull: true },
      decidedAt: { type: DataTypes.DATE(3), allowNull: true },
      note: { type: DataTypes.TEXT, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'findings' },
  );
}
