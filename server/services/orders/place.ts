/**
 * Placing an order: the garage re-read (status, terms, limit), older back-orders given any stock that has arrived,
 * the lines priced and supplied (shelf, transfer, back-order), credit checked for account orders, the held units
 * taken off their shelves, order and lines written, and for account orders their ledger entries, all in one write
 * transaction. Plain Node, so the demo seed places orders the same way.
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
import { allocateBackOrders, tellBackOrdersFilled, type Allocated } from './back-orders'
import { runAfter } from './after-commit'

export interface PlaceInput extends OrderSource { payment: PaymentMethod; garageReference?: string }

export interface Placed { order: Order; replayed: boolean; allocated: Allocated[] }

/**
 * Creates the order in the caller's write transaction, as at `now`. Returns the order with `replayed` when the
 * garage's idempotency key already made one, and the older back-orders that took stock first.
 */
export async function placeOrder(
  t: Transaction, orgId: number, user: Pick<User, 'id'>, input: PlaceInput, idempotencyKey: string | null, fmt: Formats, now = new Date(),
): Promise<Placed> {
  if (idempotencyKey) {
    const existing = await Order.findOne({ where: { organisationId: orgId, idempotencyKey }, transaction: t })
    if (existing) return { order: existing, replayed: true, allocated: [] }
  }
  const org = await Organisation.findByPk(orgId, { transaction: t })
  if (!org || org.kind !== 'garage') throw notFound('Garage')
  if (org.status !== 'approved') {
    throw forbidden('This trade account is not active, so it cannot order. Please contact the distributor.')
  }
  // stock that arrived since the last fill goes to the oldest waiting lines before this order takes any
  const allocated = await allocateBackOrders(t, { now, timeZone: fmt.timeZone })
  const priced = await priceOrder(org, input, { now, timeZone: fmt.timeZone }, t)
  if (input.payment === 'account') await assertAccountFits(org, priced.totalMinor, fmt, t, now)
  const rows = priced.lines.map((l, position) => ({
    partId: l.partId, sku: l.sku, quantity: l.quantity, position,
    source: l.source, sourceBranchId: l.branch?.id ?? null, state: l.source === 'back_order' ? 'waiting' as const : 'reserved' as const,
  }))
  await reserveStock(t, priced.branch, rows)
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
    fulfilment: priced.fulfilment,
    collect: priced.collect,
  }, { transaction: t })
  order.lines = await OrderLine.bulkCreate(priced.lines.map((l, i) => ({
    ...rows[i]!, orderId: order.id, description: l.description,
    unitListMinor: l.unitListMinor, unitNetMinor: l.unitNetMinor, lineNetMinor: l.lineNetMinor,
    coreDepositUnitMinor: l.coreDepositUnitMinor, quoteLineId: l.quoteLineId, quotedUnitNetMinor: l.quotedUnitNetMinor,
    fulfilment: l.fulfilment, lineGroup: l.group, promisedAt: priced.promisedAt[i] ?? null, readyAt: priced.readyAt[i] ?? null,
    reservedAt: l.source === 'back_order' ? null : now, taxMinor: l.lineTaxMinor, depositTaxMinor: l.coreDepositTaxMinor,
  })), { transaction: t })
  order.branch = priced.branch
  if (!card) await bookOrderCharges(t, order, null, fmt)
  return { order, replayed: false, allocated }
}

/** A garage manager's order: placed and audited, the account order's confirmation e-mailed after the commit. */
export async function submitOrder(
  orgId: number, user: Pick<User, 'id'>, input: PlaceInput, idempotencyKey: string | null, fmt: Formats, now = new Date(),
): Promise<{ order: OrderDetail; replayed: boolean }> {
  const { order, replayed, allocated } = await withWrite(async (t) => {
    const placed = await placeOrder(t, orgId, user, input, idempotencyKey, fmt, now)
    if (!placed.replayed) {
      await audit(t, {
        actorUserId: user.id, organisationId: orgId, action: 'order.place', entity: 'order', entityId: placed.order.id,
        changes: {
          payment: input.payment, totalMinor: placed.order.totalMinor, quoteId: input.quoteId ?? null, lines: placed.order.lines?.length ?? 0,
          backOrdered: (placed.order.lines ?? []).filter((l) => l.state === 'waiting').length,
        },
      })
    }
    return placed
  })
  await runAfter([
    ...(allocated.length ? [() => tellBackOrdersFilled(allocated)] : []),
    ...(!replayed && order.paymentMethod === 'account' ? [() => mailOrder(order.id, 'confirmed', fmt)] : []),
  ])
  return { order: await orderDetail(await findGarageOrder(orgId, order.id), 'garage', { now, timeZone: fmt.timeZone }), replayed }
}
