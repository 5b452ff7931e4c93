/**
 * Models of the work after a quote (migration 0016): part relations, the vehicle's workshop figures, the labour
 * guide, job cards and the garage's invoices to owners. Job cards and owner invoices are always queried with the
 * caller's `organisationId`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { jsonColumn } from './json-column'
import { Part } from './catalogue'
import type { PartRelationKind } from '../../shared/utils/jobs/relations'
import type { JobCheck, Torque } from '../../shared/types/jobs'
import type { OwnerInvoiceLine, TaxByRateRow } from '../../shared/types/owner-invoices'

export class PartRelation extends Model<InferAttributes<PartRelation>, InferCreationAttributes<PartRelation>> {
  declare id: CreationOptional<number>
  declare partId: number
  declare relatedPartId: number
  declare relation: PartRelationKind
  declare quantity: CreationOptional<number>
  /** the quantity is worked out from the vehicle's fluid capacity and the pack's volume */
  declare byFluidVolume: CreationOptional<boolean>
  declare reason: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare related?: Part
}

export class VehicleJobData extends Model<InferAttributes<VehicleJobData>, InferCreationAttributes<VehicleJobData>> {
  declare vehicleId: number
  declare fluidCapacityMl: CreationOptional<number | null>
  declare torques: CreationOptional<Torque[]>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class LabourTime extends Model<InferAttributes<LabourTime>, InferCreationAttributes<LabourTime>> {
  declare id: CreationOptional<number>
  declare vehicleId: number
  /** null: the guide's hours; a garage's id: that garage's own hours */
  declare organisationId: CreationOptional<number | null>
  declare operation: string
  declare hoursHundredths: number
  declare updatedByUserId: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class JobCard extends Model<InferAttributes<JobCard>, InferCreationAttributes<JobCard>> {
  declare id: CreationOptional<number>
  declare quoteId: number
  declare organisationId: number
  declare checks: CreationOptional<JobCheck[]>
  declare odometer: CreationOptional<number | null>
  declare signedOffByUserId: CreationOptional<number | null>
  declare signedOffAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class OwnerInvoiceSeries extends Model<InferAttributes<OwnerInvoiceSeries>, InferCreationAttributes<OwnerInvoiceSeries>> {
  declare organisationId: number
  declare lastNumber: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class OwnerInvoice extends Model<InferAttributes<OwnerInvoice>, InferCreationAttributes<OwnerInvoice>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare quoteId: number
  declare number: number
  declare ownerName: string
  declare ownerEmail: string
  declare lines: CreationOptional<OwnerInvoiceLine[]>
  declare taxByRate: CreationOptional<TaxByRateRow[]>
  declare netMinor: number
  declare taxMinor: number
  declare grossMinor: number
  declare currency: string
  declare issuedByUserId: CreationOptional<number | null>
  declare issuedAt: Date
  declare mailedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare payments?: OwnerInvoicePayment[]
}

export class OwnerInvoicePayment extends Model<InferAttributes<OwnerInvoicePayment>, InferCreationAttributes<OwnerInvoicePayment>> {
  declare id: CreationOptional<number>
  declare ownerInvoiceId: number
  declare method: 'cash' | 'card' | 'transfer'
  declare amountMinor: number
  declare reference: CreationOptional<string>
  declare recordedByUserId: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export function initJobModels(sequelize: Sequelize): void {
  const { INTEGER, STRING, DATE, BOOLEAN } = DataTypes
  const id = { type: INTEGER, primaryKey: true, autoIncrement: true }
  const stamps = { createdAt: DATE, updatedAt: DATE }
  PartRelation.init({
    id, partId: INTEGER, relatedPartId: INTEGER, relation: STRING, quantity: { type: INTEGER, defaultValue: 1 },
    byFluidVolume: { type: BOOLEAN, defaultValue: false }, reason: { type: STRING, defaultValue: '' }, ...stamps,
  }, { sequelize, tableName: 'part_relations' })
  VehicleJobData.init({
    vehicleId: { type: INTEGER, primaryKey: true }, fluidCapacityMl: INTEGER, torques: jsonColumn('torques', []), ...stamps,
  }, { sequelize, tableName: 'vehicle_job_data' })
  LabourTime.init({
    id, vehicleId: INTEGER, organisationId: INTEGER, operation: STRING, hoursHundredths: INTEGER, updatedByUserId: INTEGER, ...stamps,
  }, { sequelize, tableName: 'labour_times' })
  JobCard.init({
    id, quoteId: INTEGER, organisationId: INTEGER, checks: jsonColumn('checks', []), odometer: INTEGER,
    signedOffByUserId: INTEGER, signedOffAt: DATE, ...stamps,
  }, { sequelize, tableName: 'job_cards' })
  OwnerInvoiceSeries.init({
    organisationId: { type: INTEGER, primaryKey: true }, lastNumber: { type: INTEGER, defaultValue: 0 }, ...stamps,
  }, { sequelize, tableName: 'owner_invoice_series' })
  OwnerInvoice.init({
    id, organisationId: INTEGER, quoteId: INTEGER, number: INTEGER, ownerName: STRING, ownerEmail: STRING,
    lines: jsonColumn('lines', []), taxByRate: jsonColumn('taxByRate', []), netMinor: INTEGER, taxMinor: INTEGER, grossMinor: INTEGER,
    currency: STRING, issuedByUserId: INTEGER, issuedAt: DATE, mailedAt: DATE, ...stamps,
  }, { sequelize, tableName: 'owner_invoices' })
  OwnerInvoicePayment.init({
    id, ownerInvoiceId: INTEGER, method: STRING, amountMinor: INTEGER, reference: { type: STRING, defaultValue: '' }, recordedByUserId: INTEGER, ...stamps,
  }, { sequelize, tableName: 'owner_invoice_payments' })

  PartRelation.belongsTo(Part, { as: 'related', foreignKey: 'relatedPartId' })
  OwnerInvoice.hasMany(OwnerInvoicePayment, { as: 'payments', foreignKey: 'ownerInvoiceId' })
}
