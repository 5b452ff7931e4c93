/**
 * Money sent back to the card through the payment service: what was cancelled of a card order (all of it, or the
 * lines that had not left), an accepted core return by its deposit, an accepted return by its credit note. The call carries an idempotency key from our records and runs after the commit that
 * decided it; what could not be sent stays pending and the sweep sends it later under the same key.
 */
import type { Transaction } from 'sequelize'
import type Stripe from 'stripe'
import { CoreReturn, Order } from '../../models/orders'
import { PartReturn } from '../../models/counter'
import { withWrite } from '../../utils/db'
import { useStripe } from '../../utils/stripe'
import type { Formats } from '../../../shared/utils/format'
import { bookRefundOnce } from '../orders/ledger'
import { mailOrder } from '../orders/mail'
import { coreReturnKey, orderKey, returnKey } from './keys'

/** Books an order's refund on the ledger (once) and marks the order refunded. */
export async function recordOrderRefund(t: Transaction, order: Order, refund: Stripe.Refund): Promise<void> {
  await bookRefundOnce(t, refund, { organisationId: order.organisationId, orderId: order.id, description: 'Refund sent to the card' })
  if (order.paymentState === 'refund_pending') {
    order.paymentState = 'refunded'
    order.refundId = refund.id
    await order.save({ transaction: t })
  }
}

/** Books a core deposit's refund on the ledger (once) and clears the core return's pending flag. */
export async function recordCoreRefund(t: Transaction, cr: CoreReturn, refund: Stripe.Refund): Promise<void> {
  await bookRefundOnce(t, refund, { organisationId: cr.organisationId, orderId: cr.orderId, coreReturnId: cr.id, description: 'Core deposit refunded to the card' })
  if (cr.refundPending) {
    cr.refundPending = false
    cr.refundId = refund.id
    await cr.save({ transaction: t })
  }
}

/** Sends the refund of a cancelled card order (once: the idempotency key is the order's). */
export async function issueOrderRefund(orderId: number, fmt: Formats): Promise<boolean> {
  const order = await Order.findByPk(orderId)
  if (!order || order.paymentState !== 'refund_pending' || !order.paymentIntentId) return false
  const refund = await useStripe().refunds.create({
    payment_intent: order.paymentIntentId, amount: order.cancelledMinor || order.totalMinor, reason: 'requested_by_customer',
    metadata: { orderId: String(order.id), purpose: 'order' },
  }, { idempotencyKey: `${orderKey(order)}-refund` })
  await withWrite(async (t) => {
    const o = await Order.findByPk(orderId, { transaction: t })
    if (o) await recordOrderRefund(t, o, refund)
  })
  await mailOrder(order.id, 'refunded', fmt, { amountMinor: refund.amount })
  return true
}

/** Sends an accepted core return's deposit back to the card the order was paid with. */
export async function issueCoreRefund(coreReturnId: number): Promise<boolean> {
  const cr = await CoreReturn.findByPk(coreReturnId, { include: [{ model: Order, as: 'order' }] })
  if (!cr || !cr.refundPending || !cr.order?.paymentIntentId || !cr.creditedMinor) return false
  const refund = await useStripe().refunds.create({
    payment_intent: cr.order.paymentIntentId, amount: cr.creditedMinor,
    metadata: { orderId: String(cr.orderId), coreReturnId: String(cr.id), purpose: 'core' },
  }, { idempotencyKey: `${coreReturnKey(cr)}-refund` })
  await withWrite(async (t) => {
    const row = await CoreReturn.findByPk(coreReturnId, { transaction: t })
    if (row) await recordCoreRefund(t, row, refund)
  })
  return true
}

/** Books a return's refund on the ledger (once) and clears the return's pending flag. */
export async function recordReturnRefund(t: Transaction, r: PartReturn, refund: Stripe.Refund): Promise<void> {
  await bookRefundOnce(t, refund, { organisationId: r.organisationId, orderId: r.orderId, description: 'Returned parts refunded to the card' })
  if (r.refundPending) {
    r.refundPending = false
    r.refundId = refund.id
    await r.save({ transaction: t })
  }
}

/** Sends an accepted return's credit back to the card the order was paid with (once: the key is the return's). */
export async function issueReturnRefund(returnId: number): Promise<boolean> {
  const r = await PartReturn.findByPk(returnId, { include: [{ model: Order, as: 'order' }] })
  if (!r || !r.refundPending || !r.order?.paymentIntentId || !r.creditedMinor) return false
  const refund = await useStripe().refunds.create({
    payment_intent: r.order.paymentIntentId, amount: r.creditedMinor,
    metadata: { orderId: String(r.orderId), returnId: String(r.id), purpose: 'return' },
  }, { idempotencyKey: `${returnKey(r)}-refund` })
  await withWrite(async (t) => {
    const row = await PartReturn.findByPk(returnId, { transaction: t })
    if (row) await recordReturnRefund(t, row, refund)
  })
  return true
}
