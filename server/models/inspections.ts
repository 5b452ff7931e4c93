/**
 * Inspections recorded by a garage (migration 0005). JSON columns are stored as text and exposed parsed.
 * Always query with `organisationId` of the caller: a garage sees only its own inspections.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { WearInput, WearResult } from '../../shared/utils/brake'
import { User } from './accounts'
import { Vehicle } from './catalogue'
import type { InspectionRecommendation } from '../../shared/schemas/inspections'

const json = (field: string, fallback: unknown) => ({
  type: DataTypes.TEXT,
  get(this: Model) {
    const raw = this.getDataValue(field) as string | null
    return raw == null ? fallback : JSON.parse(raw)
  },
  set(this: Model, v: unknown) {
    this.setDataValue(field, v == null ? null : JSON.stringify(v))
  },
})

export class Inspection extends Model<InferAttributes<Inspection>, InferCreationAttributes<Inspection>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare vehicleId: number
  declare authorUserId: number
  declare registration: CreationOptional<string>
  declare odometer: CreationOptional<string>
  declare answers: CreationOptional<Record<string, string>>
  declare wearInput: WearInput
  declare result: WearResult
  declare overall: 'ok' | 'advise' | 'fail'
  declare recommendedParts: CreationOptional<InspectionRecommendation[]>
  declare createdAt: CreationOptional<Date>
  declare vehicle?: Vehicle
  declare author?: User
}

export function initInspectionModels(sequelize: Sequelize): void {
  const { INTEGER, STRING, DATE } = DataTypes
  Inspection.init({
    id: { type: INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: INTEGER, vehicleId: INTEGER, authorUserId: INTEGER,
    registration: STRING, odometer: STRING,
    answers: json('answers', {}), wearInput: json('wearInput', null), result: json('result', null),
    overall: STRING, recommendedParts: json('recommendedParts', []), createdAt: DATE,
  }, { sequelize, tableName: 'inspections', updatedAt: false })
  // bound after the account and catalogue models (initModels order)
  Inspection.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' })
  Inspection.belongsTo(User, { as: 'author', foreignKey: 'authorUserId' })
}
