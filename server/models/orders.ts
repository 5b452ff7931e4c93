/**
 * Orders, their lines, handled payment events, the garages' ledger and expected core returns (0008-orders); each
 * line's supply and stated tax, the order's fulfilment choice (0015-counter-day).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { CoreReturnStatus, Fulfilment, LedgerKind, LineState, OrderStatus, PaymentMethod, PaymentState, SupplySource } from '../../shared/types/orders'
import { Branch, Organisation, User } from './accounts'
import { Part } from './catalogue'

export class Order extends Model<InferAttributes<Order>, InferCreationAttributes<Order>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare branchId: number
  declare placedByUserId: number
  declare quoteId: CreationOptional<number | null>
  declare status: OrderStatus
  declare paymentMethod: PaymentMethod
  declare paymentState: PaymentState
  declare subtotalMinor: number
  declare coreDepositMinor: number
  declare taxRateBp: number
  declare taxMinor: number
  declare totalMinor: number
  declare currency: string
  declare garageReference: CreationOptional<string>
  declare idempotencyKey: CreationOptional<string | null>
  declare stockHeld: CreationOptional<boolean>
  declare checkoutSessionId: CreationOptional<string | null>
  declare checkoutAttempt: CreationOptional<number>
  declare paymentIntentId: CreationOptional<string | null>
  declare declineReason: CreationOptional<string | null>
  declare declineCode: CreationOptional<string | null>
  declare declinedAt: CreationOptional<Date | null>
  declare paidAt: CreationOptional<Date | null>
  declare pickingAt: CreationOptional<Date | null>
  declare dispatchedAt: CreationOptional<Date | null>
  declare deliveredAt: CreationOptional<Date | null>
  declare cancelledAt: CreationOptional<Date | null>
  declare cancelReason: CreationOptional<string | null>
  declare cancelledByUserId: CreationOptional<number | null>
  declare refundId: CreationOptional<string | null>
  declare fulfilment: CreationOptional<Fulfilment>
  declare collect: CreationOptional<boolean>
  /** the gross credited for lines cancelled before they left (what a card refund sends back) */
  declare cancelledMinor: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  declare lines?: NonAttribute<OrderLine[]>
  declare organisation?: NonAttribute<Organisation>
  declare branch?: NonAttribute<Branch>
  declare placedBy?: NonAttribute<User>
  declare coreReturns?: NonAttribute<CoreReturn[]>
}

export class OrderLine extends Model<InferAttributes<OrderLine>, InferCreationAttributes<OrderLine>> {
  declare id: CreationOptional<number>
  declare orderId: number
  declare partId: number
  declare sku: string
  declare description: string
  declare quantity: number
  declare unitListMinor: number
  declare unitNetMinor: number
  declare lineNetMinor: number
  declare coreDepositUnitMinor: number
  declare quoteLineId: CreationOptional<number | null>
  declare quotedUnitNetMinor: CreationOptional<number | null>
  declare position: number
  declare source: CreationOptional<SupplySource>
  /** where the units are held (null while back-ordered and not yet arrived) */
  declare sourceBranchId: CreationOptional<number | null>
  declare state: CreationOptional<LineState>
  declare fulfilment: CreationOptional<Fulfilment>
  /** the requested line this supply fills */
  declare lineGroup: CreationOptional<number>
  declare promisedAt: CreationOptional<Date | null>
  declare readyAt: CreationOptional<Date | null>
  declare reservedAt: CreationOptional<Date | null>
  declare pickedQuantity: CreationOptional<number | null>
  declare dispatchId: CreationOptional<number | null>
  declare splitFromLineId: CreationOptional<number | null>
  /** the tax stated for the line's net and for its deposits */
  declare taxMinor: CreationOptional<number>
  declare depositTaxMinor: CreationOptional<number>

  declare order?: NonAttribute<Order>
}

export class PaymentEvent extends Model<InferAttributes<PaymentEvent>, InferCreationAttributes<PaymentEvent>> {
  declare id: CreationOptional<number>
  declare eventId: string
  declare type: string
  declare orderId: number | null
  declare outcome: string
  declare createdAt: CreationOptional<Date>
}

export class LedgerEntry extends Model<InferAttributes<LedgerEntry>, InferCreationAttributes<LedgerEntry>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare orderId: number | null
  declare coreReturnId: CreationOptional<number | null>
  declare kind: LedgerKind
  declare amountMinor: number
  declare reference: string
  declare description: string
  declare externalId: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
}

export class CoreReturn extends Model<InferAttributes<CoreReturn>, InferCreationAttributes<CoreReturn>> {
  declare id: CreationOptional<number>
  declare organisationId: number
  declare orderId: number
  declare orderLineId: number
  declare status: CoreReturnStatus
  declare quantityExpected: number
  declare quantityBooked: CreationOptional<number | null>
  declare depositUnitMinor: number
  declare garageNote: CreationOptional<string>
  declare bookedAt: CreationOptional<Date | null>
  declare bookedByUserId: CreationOptional<number | null>
  declare decidedAt: CreationOptional<Date | null>
  declare decidedByUserId: CreationOptional<number | null>
  declare reason: CreationOptional<string | null>
  declare creditedMinor: CreationOptional<number | null>
  declare refundId: CreationOptional<string | null>
  declare refundPending: CreationOptional<boolean>
  declare creditNoteId: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  declare line?: NonAttribute<OrderLine>
  declare order?: NonAttribute<Order>
  declare organisation?: NonAttribute<Organisation>
}

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }
const { INTEGER, STRING, TEXT, BOOLEAN, DATE } = DataTypes

export function initOrderModels(sequelize: Sequelize): void {
  Order.init({
    id, organisationId: INTEGER, branchId: INTEGER, placedByUserId: INTEGER, quoteId: INTEGER,
    status: STRING, paymentMethod: STRING, paymentState: STRING,
    subtotalMinor: INTEGER, coreDepositMinor: INTEGER, taxRateBp: INTEGER, taxMinor: INTEGER, totalMinor: INTEGER,
    currency: STRING, garageReference: { type: STRING, defaultValue: '' }, idempotencyKey: STRING,
    stockHeld: { type: BOOLEAN, defaultValue: true },
    checkoutSessionId: STRING, checkoutAttempt: { type: INTEGER, defaultValue: 0 }, paymentIntentId: STRING,
    declineReason: TEXT, declineCode: STRING, declinedAt: DATE,
    paidAt: DATE, pickingAt: DATE, dispatchedAt: DATE, deliveredAt: DATE,
    cancelledAt: DATE, cancelReason: TEXT, cancelledByUserId: INTEGER, refundId: STRING,
    fulfilment: { type: STRING, defaultValue: 'ship_available' }, collect: { type: BOOLEAN, defaultValue: false },
    cancelledMinor: { type: INTEGER, defaultValue: 0 },
    createdAt: DATE, updatedAt: DATE,
  }, { sequelize, tableName: 'orders' })
  OrderLine.init({
    id, orderId: INTEGER, partId: INTEGER, sku: STRING, description: STRING, quantity: INTEGER,
    unitListMinor: INTEGER, unitNetMinor: INTEGER, lineNetMinor: INTEGER, coreDepositUnitMinor: INTEGER,
    quoteLineId: INTEGER, quotedUnitNetMinor: INTEGER, position: INTEGER,
    source: { type: STRING, defaultValue: 'home' }, sourceBranchId: INTEGER, state: { type: STRING, defaultValue: 'reserved' },
    fulfilment: { type: STRING, defaultValue: 'ship_available' }, lineGroup: { type: INTEGER, defaultValue: 0 },
    promisedAt: DATE, readyAt: DATE, reservedAt: DATE, pickedQuantity: INTEGER, dispatchId: INTEGER, splitFromLineId: INTEGER,
    taxMinor: { type: INTEGER, defaultValue: 0 }, depositTaxMinor: { type: INTEGER, defaultValue: 0 },
  }, { sequelize, tableName: 'order_lines', timestamps: false })
  PaymentEvent.init({
    id, eventId: STRING, type: STRING, orderId: INTEGER, outcome: STRING, createdAt: DATE,
  }, { sequelize, tableName: 'payment_events', updatedAt: false })
  LedgerEntry.init({
    id, organisationId: INTEGER, orderId: INTEGER, coreReturnId: INTEGER, kind: STRING, amountMinor: INTEGER,
    reference: STRING, description: { type: STRING, defaultValue: '' }, externalId: STRING, createdAt: DATE,
  }, { sequelize, tableName: 'ledger_entries', updatedAt: false })
  CoreReturn.init({
    id, organisationId: INTEGER, orderId: INTEGER, orderLineId: INTEGER, status: STRING,
    quantityExpected: INTEGER, quantityBooked: INTEGER, depositUnitMinor: INTEGER,
    garageNote: { type: STRING, defaultValue: '' }, bookedAt: DATE, bookedByUserId: INTEGER,
    decidedAt: DATE, decidedByUserId: INTEGER, reason: TEXT, creditedMinor: INTEGER, refundId: STRING,
    refundPending: { type: BOOLEAN, defaultValue: false }, creditNoteId: INTEGER, createdAt: DATE, updatedAt: DATE,
  }, { sequelize, tableName: 'core_returns' })

  Order.hasMany(OrderLine, { as: 'lines', foreignKey: 'orderId' })
  OrderLine.belongsTo(Order, { as: 'order', foreignKey: 'orderId' })
  OrderLine.belongsTo(Part, { as: 'part', foreignKey: 'partId' })
  Order.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
  Order.belongsTo(Branch, { as: 'branch', foreignKey: 'branchId' })
  Order.belongsTo(User, { as: 'placedBy', foreignKey: 'placedByUserId' })
  Order.hasMany(CoreReturn, { as: 'coreReturns', foreignKey: 'orderId' })
  CoreReturn.belongsTo(Order, { as: 'order', foreignKey: 'orderId' })
  CoreReturn.belongsTo(OrderLine, { as: 'line', foreignKey: 'orderLineId' })
  CoreReturn.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' })
  LedgerEntry.belongsTo(Order, { as: 'order', foreignKey: 'orderId' })
}
