/**
 * Placing an order: the garage re-read (status, terms, limit), the lines priced, credit checked for account
 * orders, stock reserved, order and lines written, and for account orders their ledger entries and expected
 * core returns, all in one write transaction. Plain Node, so the demo seed places orders the same way.
 */
import type { Transaction } from 'sequelize'
import { Organisation, type User } from '../../models/accounts'
import { Order, OrderLine } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { OrderDetail, PaymentMethod } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { forbidden, notFound } from '../errors'
import { orderAmounts, priceOrder, type OrderSource } from './pricing'
import { assertAccountFits } from './credit'
import { reserveStock } from './stock'
import { bookOrderCharges } from './ledger'
import { findGarageOrder } from './find'
import { orderDetail } from './views'
import { mailOrder } from './mail'

export interface PlaceInput extends OrderSource { payment: PaymentMethod; garageReference?: string }

/**
 * Creates the order in the caller's write transaction. Returns the order with `replayed` when the garage's
 * idempotency key already made one.
 */
export async function placeOrder(
  t: Transaction, orgId: number, user: Pick<User, 'id'>, input: PlaceInput, idempotencyKey: string | null, fmt: Formats,
): Promise<{ order: Order; replayed: boolean }> {
  if (idempotencyKey) {
    const existing = await Order.findOne({ where: { organisationId: orgId, idempotencyKey }, transaction: t })
    if (existing) return { order: existing, replayed: true }
  }
  const org = await Organisation.findByPk(orgId, { transaction: t })
  if (!org || org.kind !== 'garage') throw notFound('Garage')
  if (org.status !== 'approved') {
    throw forbidden('This trade account is not active, so it cannot order. Please contact the distributor.')
  }
  const priced = await priceOrder(org, input, t)
  if (input.payment === 'account') await assertAccountFits(org, priced.totalMinor, fmt, t)
  await reserveStock(t, priced.branch, priced.lines)
  const card = input.payment === 'card'
  const order = await Order.create({
    ...orderAmounts(priced, fmt.currency),
    organisationId: org.id,
    branchId: priced.branch.id,
    placedByUserId: user.id,
    quoteId: input.quoteId ?? null,
    status: card ? 'awaiting_payment' : 'confirmed',
    paymentMethod: input.payment,
    paymentState: card ? 'unpaid' : 'on_account',
    garageReference: input.garageReference ?? '',
    idempotencyKey,
    stockHeld: true,
  }, { transaction: t })
  order.lines = await OrderLine.bulkCreate(priced.lines.map((l, position) => ({
    orderId: order.id, partId: l.partId, sku: l.sku, description: l.description, quantity: l.quantity,
    unitListMinor: l.unitListMinor, unitNetMinor: l.unitNetMinor, lineNetMinor: l.lineNetMinor,
    coreDepositUnitMinor: l.coreDepositUnitMinor, quoteLineId: l.quoteLineId, quotedUnitNetMinor: l.quotedUnitNetMinor, position,
  })), { transaction: t })
  order.branch = priced.branch
  if (!card) await bookOrderCharges(t, order, null, fmt)
  return { order, replayed: false }
}

/** A garage manager's order: placed and audited, the account order's confirmation e-mailed after the commit. */
export async function submitOrder(
  orgId: number, user: Pick<User, 'id'>, input: PlaceInput, idempotencyKey: string | null, fmt: Formats,
): Promise<{ order: OrderDetail; replayed: boolean }> {
  const { order, replayed } = await withWrite(async (t) => {
    const placed = await placeOrder(t, orgId, user, input, idempotencyKey, fmt)
    if (!placed.replayed) {
      await audit(t, {
        actorUserId: user.id, organisationId: orgId, action: 'order.place', entity: 'order', entityId: placed.order.id,
        changes: { payment: input.payment, totalMinor: placed.order.totalMinor, quoteId: input.quoteId ?? null, lines: placed.order.lines?.length ?? 0 },
      })
    }
    return placed
  })
  if (!replayed && order.paymentMethod === 'account') await mailOrder(order.id, 'confirmed', fmt)
  return { order: await orderDetail(await findGarageOrder(orgId, order.id), 'garage'), replayed }
}
