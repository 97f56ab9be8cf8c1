import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { TimelineKind } from '../../shared/schemas/cases';
import { jsonText } from './json-text';
import type { User } from './user';

/** One entry of a case's append-only timeline (never updated or deleted on its own). */
export class CaseEvent extends Model<InferAttributes<CaseEvent>, InferCreationAttributes<CaseEvent>> {
  declare id: CreationOptional<number>;
  declare shopId: number;
  declare caseId: number;
  declare actorId: number | null;
  declare kind: TimelineKind;
  declare message: string;
  declare note: string | null;
  declare data: Record<string, unknown>;
  declare createdAt: CreationOptional<Date>;
  declare actor?: NonAttribute<User | null>;
}

export function initCaseEvent(sequelize: Sequelize): void {
  CaseEvent.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      shopId: { type: DataTypes.INTEGER, allowNull: false },
      caseId: { type: DataTypes.INTEGER, allowNull: false },
      actorId: { type: DataTypes.INTEGER, allowNull: true },
      kind: { type: DataTypes.STRING(24), allowNull: false },
      message: { type: DataTypes.TEXT, allowNull: false },
      note: { type: DataTypes.TEXT, allowNull: true },
      data: jsonText('data'),
      createdAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'case_events', updatedAt: false },
  );
}
