// A TEXT column holding JSON: the model reads and writes the parsed value. MariaDB's JSON type is
// LONGTEXT under another name, and the driver hands it back as a string, so the parsing is ours.
import { DataTypes, type ModelAttributeColumnOptions } from 'sequelize';

/** Column options for a JSON value stored as text (`long` for LONGTEXT). */
export function jsonText(field: string, options: { allowNull?: boolean; long?: boolean } = {}): ModelAttributeColumnOptions {
  return {
    type: options.long ? DataTypes.TEXT('long') : DataTypes.TEXT,
    allowNull: options.allowNull ?? false,
    get(this: { getDataValue(k: string): unknown }) {
      const raw = this.getDataValue(field);
      return typeof raw === 'string' ? JSON.parse(raw) : (raw ?? null);
    },
    set(this: { setDataValue(k: string, v: unknown): void }, value: unknown) {
      this.setDataValue(field, value === null || value === undefined ? null : JSON.stringify(value));
    },
  } as ModelAttributeColumnOptions;
}
