import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Shop } from './shop';

/** A message the local mail fake received; shopId is set when the sender said which shop it concerns. */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  declare shopId: ForeignKey<Shop['id']> | null;
  declare to: string;
  declare from: string;
  declare subject: string;
  declare text: string;
  declare html: string | null;
  /** Attachments the fake received, JSON text [{ filename, contentType, size, base64 }] (null: none). */
  declare attachments: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
}

export function initMailMessage(sequelize: Sequelize): void {
  MailMessage.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      to: { type: DataTypes.STRING(1000), allowNull: false },
      from: { type: DataTypes.STRING(1000), allowNull: false },
      subject: { type: DataTypes.STRING(1000), allowNull: false },
      text: { type: DataTypes.TEXT('medium'), allowNull: false },
      html: { type: DataTypes.TEXT('medium'), allowNull: true },
      attachments: { type: DataTypes.TEXT('long'), allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'mail_messages', updatedAt: false },
  );
}
