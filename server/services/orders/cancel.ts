/**
 * Cancelling an order, by the garage (before picking starts) or the counter (before it leaves): the stock goes
 * back, an account order is credited, a paid card order is credited and refunded, an open checkout is closed.
 * Nitro only (the payment service).
 */
import type { Transaction } from 'sequelize'
import type { User } from '../../models/accounts'
import { CoreReturn, type Order } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { useStripe } from '../../utils/stripe'
import type { OrderDetail } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { conflict } from '../errors'
import { issueOrderRefund } from '../payments/refunds'
import { runAfter, type After } from './after-commit'
import { creditCancelledOrder } from './ledger'
import { findGarageOrder } from './find'
import { garageMayCancel } from './rules'
import { releaseStock } from './stock'
import { mailOrder } from './mail'
import { orderDetail } from './views'

/**
 * Cancels an order inside the caller's transaction and returns what is left to do after the commit: the
 * e-mail first, then the refund and closing the checkout at the payment service.
 */
export async function cancelOrder(t: Transaction, order: Order, actor: Pick<User, 'id'>, reason: string, fmt: Formats): Promise<After> {
  const was = order.status
  const after: After = [() => mailOrder(order.id, 'cancelled', fmt, { reason: reason || undefined })]
  await releaseStock(t, order)
  order.status = 'cancelled'
  order.cancelledAt = new Date()
  order.cancelReason = reason || null
  order.cancelledByUserId = actor.id
  if (order.paymentState === 'paid' || order.paymentState === 'on_account') {
    await creditCancelledOrder(t, order)
    if (order.paymentState === 'paid') {
      order.paymentState = 'refund_pending'
      after.push(() => issueOrderRefund(order.id, fmt))
    } else {
      order.paymentState = 'credited'
    }
    await CoreReturn.update({ status: 'void' }, { where: { orderId: order.id, status: 'expected' }, transaction: t })
  }
  await order.save({ transaction: t })
  await audit(t, { actorUserId: actor.id, organisationId: order.organisationId, action: 'order.cancel', entity: 'order', entityId: order.id, changes: { from: was, reason } })
  if (was === 'awaiting_payment' && order.checkoutSessionId) {
    const id = order.checkoutSessionId
    after.push(() => useStripe().checkout.sessions.expire(id).catch(() => null))
  }
  return after
}

/** The garage cancels its own order; 409 once picking has started (the counter decides then) or when already closed. */
export async function cancelGarageOrder(orgId: number, orderId: number, actor: Pick<User, 'id'>, reason: string, fmt: Formats): Promise<OrderDetail> {
  const after = await withWrite(async (t) => {
    const order = await findGarageOrder(orgId, orderId, t)
    if (!garageMayCancel(order)) {
      throw conflict(order.status === 'cancelled'
        ? 'This order is already cancelled.'
        : 'Picking has started, so the order can no longer be cancelled here. Please call the branch.')
    }
    return cancelOrder(t, order, actor, reason, fmt)
  })
  await runAfter(after)
  return orderDetail(await findGarageOrder(orgId, orderId), 'garage')
}
