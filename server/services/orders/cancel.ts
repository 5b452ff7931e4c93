/**
 * Cancelling an order, by the garage (before picking starts) or the counter (before it leaves): what has not left
 * is cancelled, its held units go back on their shelves (where older back-orders may take them), an account order
 * is credited, a paid card order is credited and refunded, an open checkout is closed. When part of the order has
 * already left, only the rest is cancelled and credited, and the order stands as dispatched. Nothing that was
 * cancelled had been invoiced (invoices are issued with each dispatch), so no credit note is needed for it: the
 * ledger credit reverses the charge. Nitro only (the payment service).
 */
import type { Transaction } from 'sequelize'
import type { User } from '../../models/accounts'
import { CoreReturn, OrderLine, type Order } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { useStripe } from '../../utils/stripe'
import type { OrderDetail } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { conflict } from '../errors'
import { issueOrderRefund } from '../payments/refunds'
import { runAfter, type After } from './after-commit'
import { allocateBackOrders, tellBackOrdersFilled } from './back-orders'
import { systemClock, type ViewClock } from './clock'
import { creditCancelledOrder } from './ledger'
import { findGarageOrder } from './find'
import { garageMayCancel } from './rules'
import { HOLDING_STATES, putStock } from './stock'
import { mailOrder } from './mail'
import { orderDetail } from './views'

const NOT_SENT = ['reserved', 'waiting', 'picked']

/** What a line costs with its tax and its deposits: what cancelling it credits. */
const grossOf = (l: OrderLine) => l.lineNetMinor + (l.taxMinor ?? 0) + l.coreDepositUnitMinor * l.quantity + (l.depositTaxMinor ?? 0)

/**
 * Cancels what has not left inside the caller's transaction and returns what is left to do after the commit:
 * the e-mail first, then the refund and closing the checkout at the payment service.
 */
export async function cancelOrder(t: Transaction, order: Order, actor: Pick<User, 'id'>, reason: string, fmt: Formats, clock: ViewClock = systemClock(fmt.timeZone)): Promise<After> {
  const was = order.status
  const lines = order.lines ?? await OrderLine.findAll({ where: { orderId: order.id }, transaction: t })
  const open = lines.filter((l) => NOT_SENT.includes(l.state ?? 'reserved'))
  const partly = lines.some((l) => l.state === 'dispatched')
  const amount = partly ? open.reduce((s, l) => s + grossOf(l), 0) : order.totalMinor
  for (const l of open) {
    if (order.stockHeld && HOLDING_STATES.includes(l.state ?? 'reserved')) await putStock(t, l.sourceBranchId ?? order.branchId, l.partId, l.quantity, clock.now)
    l.state = 'cancelled'
    await l.save({ transaction: t })
  }
  if (!partly) order.stockHeld = false
  order.status = partly ? 'dispatched' : 'cancelled'
  order.cancelledAt = clock.now
  order.cancelReason = reason || null
  order.cancelledByUserId = actor.id
  order.cancelledMinor = (order.cancelledMinor ?? 0) + amount
  const after: After = [() => mailOrder(order.id, 'cancelled', fmt, { reason: reason || undefined, amountMinor: amount })]
  if ((order.paymentState === 'paid' || order.paymentState === 'on_account') && amount > 0) {
    await creditCancelledOrder(t, order, amount)
    if (order.paymentState === 'paid') {
      order.paymentState = 'refund_pending'
      after.push(() => issueOrderRefund(order.id, fmt))
    } else if (!partly) {
      order.paymentState = 'credited'
    }
    await CoreReturn.update({ status: 'void' }, { where: { orderId: order.id, status: 'expected' }, transaction: t })
  }
  await order.save({ transaction: t })
  await audit(t, { actorUserId: actor.id, organisationId: order.organisationId, action: 'order.cancel', entity: 'order', entityId: order.id, changes: { from: was, reason, creditedMinor: amount, lines: open.length } })
  // the units just put back may be what an older order is waiting for
  const filled = await allocateBackOrders(t, { partIds: [...new Set(open.map((l) => l.partId))], now: clock.now, timeZone: clock.timeZone })
  if (filled.length) after.push(() => tellBackOrdersFilled(filled))
  if (was === 'awaiting_payment' && order.checkoutSessionId) {
    const id = order.checkoutSessionId
    after.push(() => useStripe().checkout.sessions.expire(id).catch(() => null))
  }
  return after
}

/** The garage cancels its own order; 409 once picking has started (the counter decides then) or when already closed. */
export async function cancelGarageOrder(orgId: number, orderId: number, actor: Pick<User, 'id'>, reason: string, fmt: Formats, clock: ViewClock = systemClock(fmt.timeZone)): Promise<OrderDetail> {
  const after = await withWrite(async (t) => {
    const order = await findGarageOrder(orgId, orderId, t)
    if (!garageMayCancel(order)) {
      throw conflict(order.status === 'cancelled'
        ? 'This order is already cancelled.'
        : 'Picking has started, so the order can no longer be cancelled here. Please call the branch.')
    }
    return cancelOrder(t, order, actor, reason, fmt, clock)
  })
  await runAfter(after)
  return orderDetail(await findGarageOrder(orgId, orderId), 'garage', clock)
}
