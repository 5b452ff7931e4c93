/** A JSON column: stored as text, read and written parsed (`fallback` when the stored value is null). */
import { DataTypes, type Model } from 'sequelize'

export function jsonColumn(field: string, fallback: unknown) {
  return {
    type: DataTypes.TEXT,
    get(this: Model) {
      const raw = this.getDataValue(field) as string | null
      return raw == null ? fallback : JSON.parse(raw)
    },
    set(this: Model, v: unknown) {
      this.setDataValue(field, v == null ? null : JSON.stringify(v))
    },
  }
}
