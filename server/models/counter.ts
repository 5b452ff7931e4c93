/**
 * The counter's day (0015-counter-day): branches' delivery runs, bins, dispatches, issued documents (invoices and
 * credit notes, immutable: the database refuses to change them), returned parts with their photos, and the
 * garage's basket kept with its account.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { CreditReason, DocumentKind, DocumentLineKind } from '../../shared/types/documents'
import type { ReturnReason, ReturnStatus } from '../../shared/types/returns'
import { Branch, Organisation } from './accounts'
import { Order, OrderLine } from './orders'

export class DeliveryRun extends Model<InferAttributes<DeliveryRun>, InferCreationAttributes<DeliveryRun>> {
  declare id: CreationOptional<number>
  declare branchId: number
  /** minutes after local midnight */
  declare departsMinute: number
  declare cutoffMinutes: CreationOptional<number>
  declare transitMinutes: CreationOptional<number>
  /** ISO weekday digits, "12345" = Monday to Friday */
  declare weekdays: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class StockBin extends Model<InferAttributes<StockBin>, InferCreationAttributes<StockBin>> {
  declare partId: number
  declare branchId: number
  declare bin: string
}

export class Dispatch extends Model<InferAttributes<Dispatch>, InferCreationAttributes<Dispatch>> {
  declare id: CreationOptional<number>
  declare orderId: number
  declare seq: number
  declare branchId: number
  declare dispatchedAt: Date
  declare dispatchedByUserId: number | null
  declare createdAt: CreationOptional<Date>
}

export class IssuedDocument extends Model<InferAttributes<IssuedDocument>, InferCreationAttributes<IssuedDocument>> {
  declare id: CreationOptional<number>
  declare kind: DocumentKind
  declare series: string
  declare number: number
  declare reference: string
  declare organisationId: number
  declare orderId: number
  declare dispatchId: number | null
  declare invoiceId: number | null
  declare reason: CreditReason | null
  declare issuedAt: Date
  declare taxPoint: string
  declare currency: string
  declare netMinor: number
  declare taxMinor: number
  declare totalMinor: number
  /** JSON: the particulars as issued */
  declare body: string
  declare createdAt: CreationOptional<Date>

  declare lines?: NonAttribute<DocumentLine[]>
  declare invoice?: NonAttribute<IssuedDocument | null>
  declare organisation?: NonAttribute<Organisation>
  declare order?: NonAttribute<Order>
}

export class DocumentLine extends Model<InferAttributes<DocumentLine>, InferCreationAttributes<DocumentLine>> {
  declare id: CreationOptional<number>
  declare documentId: number
  declare orderLineId: number | null
  declare kind: DocumentLineKind
  declare sku: string
  declare description: string
  declare quantity: number
  declare unitMinor: number
  declare netMinor: number
  declare taxBp: number
  declare taxMinor: number
  declare position: number
}

export class PartReturn extends Model<InferAttributes<PartReturn>, InferCreationAttributes<PartReturn>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare orderId: number
  declare orderLineId: number
  declare invoiceId: number
  declare reason: ReturnReason
  declare quantity: number
  declare note: CreationOptional<string>
  declare fittedOn: CreationOptional<string | null>
  declare mileage: CreationOptional<number | null>
  declare fault: CreationOptional<string | null>
  declare status: ReturnStatus
  declare acceptedQuantity: CreationOptional<number | null>
  declare decisionReason: CreationOptional<string | null>
  declare restockingBp: CreationOptional<number>
  declare creditedMinor: CreationOptional<number | null>
  declare creditNoteId: CreationOptional<number | null>
  declare refundPending: CreationOptional<boolean>
  declare refundId: CreationOptional<string | null>
  declare requestedByUserId: number
  declare decidedByUserId: CreationOptional<number | null>
  declare decidedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  declare line?: NonAttribute<OrderLine>
  declare order?: NonAttribute<Order>
  declare organisation?: NonAttribute<Organisation>
  declare photos?: NonAttribute<PartReturnPhoto[]>
  declare creditNote?: NonAttribute<IssuedDocument | null>
}

export class PartReturnPhoto extends Model<InferAttributes<PartReturnPhoto>, InferCreationAttributes<PartReturnPhoto>> {
  declare id: CreationOptional<number>
  declare returnId: number
  declare storedName: string
  declare originalName: string
  declare mime: string
  declare sizeBytes: number
  declare createdAt: CreationOptional<Date>
}

export class BasketLine extends Model<InferAttributes<BasketLine>, InferCreationAttributes<BasketLine>> {
  declare organisationId: number
  declare sku: string
  declare description: string
  declare quantity: number
  declare position: number
  declare updatedAt: CreationOptional<Date>
}

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }
const { INTEGER, STRING, TEXT, BOOLEAN, DATE } = DataTypes

export function initCounterModels(sequelize: Sequelize): void {
  DeliveryRun.init({
    id, branchId: INTEGER, departsMinute: INTEGER, cutoffMinutes: { type: INTEGER, defaultValue: 30 },
    transitMinutes: { type: INTEGER, defaultValue: 45 }, weekdays: { type: STRING, defaultValue: '12345' }, createdAt: DATE, updatedAt: DATE,
  }, { sequelize, tableName: 'delivery_runs' })
  StockBin.init({
    partId: { type: INTEGER, primaryKey: true }, branchId: { type: INTEGER, primaryKey: true }, bin: STRING,
  }, { sequelize, tableName: 'stock_bins', timestamps: false })
  Dispatch.init({
    id, orderId: INTEGER, seq: INTEGER, branchId: INTEGER, dispatchedAt: DATE, dispatchedByUserId: INTEGER, createdAt: DATE,
  }, { sequelize, tableName: 'dispatches', updatedAt: false })
  IssuedDocument.init({
    id, kind: STRING, series: STRING, number: INTEGER, reference: STRING, organisationId: INTEGER, orderId: INTEGER,
    dispatchId: INTEGER, invoiceId: INTEGER, reason: STRING, issuedAt: DATE, taxPoint: STRING, currency: STRING,
    netMinor: INTEGER, taxMinor: INTEGER, totalMinor: INTEGER, body: TEXT, createdAt: DATE,
  }, { sequelize, tableName: 'documents', updatedAt: false })
  DocumentLine.init({
    id, documentId: INTEGER, orderLineId: INTEGER, kind: STRING, sku: { type: STRING, defaultValue: '' }, description: STRING,
    quantity: INTEGER, unitMinor: INTEGER, netMinor: INTEGER, taxBp: INTEGER, taxMinor: INTEGER, position: { type: INTEGER, defaultValue: 0 },
  }, { sequelize, tableName: 'document_lines', timestamps: false })
  PartReturn.init({
    id, organisationId: INTEGER, orderId: INTEGER, orderLineId: INTEGER, invoiceId: INTEGER, reason: STRING, quantity: INTEGER,
    note: { type: STRING, defaultValue: '' }, fittedOn: STRING, mileage: INTEGER, fault: TEXT, status: STRING,
    acceptedQuantity: INTEGER, decisionReason: TEXT, restockingBp: { type: INTEGER, defaultValue: 0 }, creditedMinor: INTEGER,
    creditNoteId: INTEGER, refundPending: { type: BOOLEAN, defaultValue: false }, refundId: STRING,
    requestedByUserId: INTEGER, decidedByUserId: INTEGER, decidedAt: DATE, createdAt: DATE, updatedAt: DATE,
  }, { sequelize, tableName: 'part_returns' })
  PartReturnPhoto.init({
    id, returnId: INTEGER, storedName: STRING, originalName: STRING, mime: STRING, sizeBytes: INTEGER, createdAt: DATE,
  }, { sequelize, tableName: 'part_return_photos', updatedAt: false })
  BasketLine.init({
    organisationId: { type: INTEGER, primaryKey: true }, sku: { type: STRING, primaryKey: true }, description: { type: STRING, defaultValue: '' },
    quantity: INTEGER, position: { type: INTEGER, defaultValue: 0 }, updatedAt: DATE,
  }, { sequelize, tableName: 'basket_items', createdAt: false })

  Branch.hasMany(DeliveryRun, { as: 'runs', foreignKey: 'branchId' })
  OrderLine.belongsTo(Branch, { as: 'sourceBranch', foreignKey: 'sourceBranchId' })
  Order.hasMany(Dispatch, { as: 'dispatches', foreignKey: 'orderId' })
  IssuedDocument.hasMany(DocumentLine, { as: 'lines', foreignKey: 'documentId' })
  IssuedDocument.belongsTo(IssuedDocument, { as: 'invoice', foreignKey: 'invoiceId' })
  IssuedDocument.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
  IssuedDocument.belongsTo(Order, { as: 'order', foreignKey: 'orderId' })
  PartReturn.belongsTo(OrderLine, { as: 'line', foreignKey: 'orderLineId' })
  PartReturn.belongsTo(Order, { as: 'order', foreignKey: 'orderId' })
  PartReturn.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
  PartReturn.hasMany(PartReturnPhoto, { as: 'photos', foreignKey: 'returnId' })
  PartReturn.belongsTo(IssuedDocument, { as: 'creditNote', foreignKey: 'creditNoteId' })
}
