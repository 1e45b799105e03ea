import { DataTypes, type ModelAttributeColumnOptions } from 'sequelize';

/**
 * A DECIMAL column read back as a JS number (the driver returns DECIMAL as a
 * string to keep precision; our values fit a double comfortably).
 */
export function decimal(field: string, precision: number, scale: number, allowNull = true): ModelAttributeColumnOptions {
  return {
    type: DataTypes.DECIMAL(precision, scale),
    allowNull,
    get(this: { getDataValue(k: string): unknown }) {
      const v = this.getDataValue(field);
      return v === null || v === undefined ? null : Number(v);
    },
  };
}

/** A JSON column parsed on read even where the server hands back text. */
export function json(field: string, allowNull = false): ModelAttributeColumnOptions {
  return {
    type: DataTypes.JSON,
    allowNull,
    get(this: { getDataValue(k: string): unknown }) {
      const v = this.getDataValue(field);
      return typeof v === 'string' ? JSON.parse(v) : v;
    },
  };
}
