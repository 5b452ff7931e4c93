/**
 * A garage's customers and vehicles, odometer readings and follow-ups of declined work (migration 0013), and the
 * WMI table of the catalogue data. Always query with the caller's `organisationId`: a garage sees only its own.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { jsonColumn } from './json-column'
import { Vehicle } from './catalogue'
import { Quote } from './quotes'

export class GarageCustomer extends Model<InferAttributes<GarageCustomer>, InferCreationAttributes<GarageCustomer>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare name: string
  declare email: CreationOptional<string>
  declare phone: CreationOptional<string>
  declare reminderConsent: CreationOptional<boolean>
  declare consentChangedAt: CreationOptional<Date | null>
  declare consentSource: CreationOptional<string>
  declare notes: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class GarageVehicle extends Model<InferAttributes<GarageVehicle>, InferCreationAttributes<GarageVehicle>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare customerId: CreationOptional<number | null>
  declare registration: CreationOptional<string | null>
  declare vin: CreationOptional<string | null>
  declare vehicleId: CreationOptional<number | null>
  declare answers: CreationOptional<Record<string, string>>
  declare built: CreationOptional<string | null>
  declare notes: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare customer?: NonAttribute<GarageCustomer | null>
  declare vehicle?: NonAttribute<Vehicle | null>
}

export class OdometerReading extends Model<InferAttributes<OdometerReading>, InferCreationAttributes<OdometerReading>> {
  declare id: CreationOptional<number>
  declare garageVehicleId: number
  declare reading: number
  declare unit: 'mi' | 'km'
  declare readOn: string
  declare source: 'recorded' | 'inspection' | 'quote'
  declare createdAt: CreationOptional<Date>
}

export class FollowUpSettings extends Model<InferAttributes<FollowUpSettings>, InferCreationAttributes<FollowUpSettings>> {
  declare organisationId: number
  declare advisedWeeks: CreationOptional<number>
  declare requiredWeeks: CreationOptional<number>
  declare updatedAt: CreationOptional<Date>
}

export type FollowUpStatus = 'scheduled' | 'sending' | 'sent' | 'held' | 'stopped' | 'mail_failed'

export class FollowUp extends Model<InferAttributes<FollowUp>, InferCreationAttributes<FollowUp>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare garageVehicleId: number
  declare quoteId: number
  declare quoteLineId: number
  declare recommendation: 'required' | 'advised'
  declare description: string
  declare dueAt: Date
  declare status: CreationOptional<FollowUpStatus>
  declare statusNote: CreationOptional<string>
  declare sentAt: CreationOptional<Date | null>
  declare newQuoteId: CreationOptional<number | null>
  declare unsubscribeHash: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare garageVehicle?: NonAttribute<GarageVehicle>
  declare quote?: NonAttribute<Quote>
}

export class WmiCode extends Model<InferAttributes<WmiCode>, InferCreationAttributes<WmiCode>> {
  declare wmi: string
  declare make: string
  declare country: CreationOptional<string>
}

export function initGarageVehicleModels(sequelize: Sequelize): void {
  const { INTEGER, STRING, TEXT, DATE, DATEONLY, BOOLEAN } = DataTypes
  const id = { type: INTEGER, primaryKey: true, autoIncrement: true }
  const stamps = { createdAt: DATE, updatedAt: DATE }
  const d = <T>(type: T, defaultValue: unknown) => ({ type, defaultValue })
  GarageCustomer.init({
    id, organisationId: INTEGER, name: STRING, email: d(STRING, ''), phone: d(STRING, ''), reminderConsent: d(BOOLEAN, false),
    consentChangedAt: DATE, consentSource: d(STRING, ''), notes: d(TEXT, ''), ...stamps,
  }, { sequelize, tableName: 'garage_customers' })
  GarageVehicle.init({
    id, organisationId: INTEGER, customerId: INTEGER, registration: STRING, vin: STRING, vehicleId: INTEGER,
    answers: jsonColumn('answers', {}), built: STRING, notes: d(TEXT, ''), ...stamps,
  }, { sequelize, tableName: 'garage_vehicles' })
  OdometerReading.init({
    id, garageVehicleId: INTEGER, reading: INTEGER, unit: STRING, readOn: DATEONLY, source: STRING, createdAt: DATE,
  }, { sequelize, tableName: 'garage_vehicle_odometer', updatedAt: false })
  FollowUpSettings.init({
    organisationId: { type: INTEGER, primaryKey: true }, advisedWeeks: d(INTEGER, 8), requiredWeeks: d(INTEGER, 2), updatedAt: DATE,
  }, { sequelize, tableName: 'follow_up_settings', createdAt: false })
  FollowUp.init({
    id, organisationId: INTEGER, garageVehicleId: INTEGER, quoteId: INTEGER, quoteLineId: INTEGER, recommendation: STRING,
    description: STRING, dueAt: DATE, status: d(STRING, 'scheduled'), statusNote: d(STRING, ''), sentAt: DATE, newQuoteId: INTEGER,
    unsubscribeHash: STRING, ...stamps,
  }, { sequelize, tableName: 'follow_ups' })
  WmiCode.init({ wmi: { type: STRING, primaryKey: true }, make: STRING, country: d(STRING, '') }, { sequelize, tableName: 'wmi_codes', timestamps: false })

  GarageVehicle.belongsTo(GarageCustomer, { as: 'customer', foreignKey: 'customerId' })
  GarageCustomer.hasMany(GarageVehicle, { as: 'vehicles', foreignKey: 'customerId' })
  GarageVehicle.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' })
  FollowUp.belongsTo(GarageVehicle, { as: 'garageVehicle', foreignKey: 'garageVehicleId' })
  FollowUp.belongsTo(Quote, { as: 'quote', foreignKey: 'quoteId' })
}
