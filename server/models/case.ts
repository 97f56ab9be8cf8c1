import {
  DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize,
} from 'sequelize';
import type { CaseStatus, Vehicle } from '../../shared/schemas/cases';
import type { Engine } from './engine';
import { jsonText } from './json-text';
import type { User } from './user';

/** The confirmed cause of a case. */
export interface ConfirmedCause {
  component: string;
  fault: string | null;
  findingId: number | null;
  note: string;
  byId: number | null;
  at: string;
}

/** One repair order (DESIGN.md "Case"); status moves only as CASE_MOVES allows (services/case-status.ts). */
export class Case extends Model<InferAttributes<Case>, InferCreationAttributes<Case>> {
  declare id: CreationOptional<number>;
  declare shopId: number;
  declare roNumber: string;
  declare vehicle: Vehicle;
  declare engineId: number | null;
  declare complaint: string;
  declare technicianId: number | null;
  declare leadId: number | null;
  declare createdById: number | null;
  declare advisorName: CreationOptional<string>;
  declare advisorEmail: CreationOptional<string>;
  declare status: CaseStatus;
  declare confirmed: CreationOptional<ConfirmedCause | null>;
  declare searchText: string;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare engine?: NonAttribute<Engine | null>;
  declare technician?: NonAttribute<User | null>;
  declare lead?: NonAttribute<User | null>;
}

export function initCase(sequelize: Sequelize): void {
  Case.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false },
      roNumber: { type: DataTypes.STRING(40), allowNull: false },
      vehicle: jsonText('vehicle'),
      engineId: { type: DataTypes.INTEGER, allowNull: true },
      complaint: { type: DataTypes.TEXT, allowNull: false },
      technicianId: { type: DataTypes.INTEGER, allowNull: true },
      leadId: { type: DataTypes.INTEGER, allowNull: true },
      createdById: { type: DataTypes.INTEGER, allowNull: true },
      advisorName: { type: DataTypes.STRING(100), allowNull: false, defaultValue: '' },
      advisorEmail: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
      status: { type: DataTypes.STRING(12), allowNull: false },
      confirmed: jsonText('confirmed', { allowNull: true }),
      searchText: { type: DataTypes.TEXT, allowNull: false },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'cases' },
  );
}
