/**
 * Inspections recorded by a garage (migration 0005) and the photos of their findings (migration 0012). JSON columns
 * are stored as text and exposed parsed. Always query with `organisationId` of the caller: a garage sees only its
 * own inspections and photos.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { jsonColumn } from './json-column'
import type { WearInput, WearResult } from '../../shared/utils/brake'
import { User } from './accounts'
import { Vehicle } from './catalogue'
import type { InspectionRecommendation } from '../../shared/schemas/inspections'

export class Inspection extends Model<InferAttributes<Inspection>, InferCreationAttributes<Inspection>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare vehicleId: number
  declare authorUserId: number
  declare garageVehicleId: CreationOptional<number | null>
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

/** A photo a technician took of a wheel's finding; the file is under uploads/inspection-photos. */
export class InspectionPhoto extends Model<InferAttributes<InspectionPhoto>, InferCreationAttributes<InspectionPhoto>> {
  declare id: CreationOptional<number>
  declare inspectionId: number
  declare organisationId: number
  declare authorUserId: number
  /** `front-left` … `rear-right`, or `system` */
  declare position: string
  /** the part of the wheel it shows: `disc`, `pads`, `hose`, … (WearSubject) */
  declare subject: string
  declare caption: CreationOptional<string>
  declare storedName: string
  declare mime: string
  declare bytes: number
  declare createdAt: CreationOptional<Date>
}

export function initInspectionModels(sequelize: Sequelize): void {
  const { INTEGER, STRING, DATE } = DataTypes
  Inspection.init({
    id: { type: INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: INTEGER, vehicleId: INTEGER, authorUserId: INTEGER, garageVehicleId: INTEGER,
    registration: STRING, odometer: STRING,
    answers: jsonColumn('answers', {}), wearInput: jsonColumn('wearInput', null), result: jsonColumn('result', null),
    overall: STRING, recommendedParts: jsonColumn('recommendedParts', []), createdAt: DATE,
  }, { sequelize, tableName: 'inspections', updatedAt: false })
  InspectionPhoto.init({
    id: { type: INTEGER, primaryKey: true, autoIncrement: true },
    inspectionId: INTEGER, organisationId: INTEGER, authorUserId: INTEGER, position: STRING, subject: STRING,
    caption: STRING, storedName: STRING, mime: STRING, bytes: INTEGER, createdAt: DATE,
  }, { sequelize, tableName: 'inspection_photos', updatedAt: false })
  // bound after the account and catalogue models (initModels order)
  Inspection.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' })
  Inspection.belongsTo(User, { as: 'author', foreignKey: 'authorUserId' })
}
