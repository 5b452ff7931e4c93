/**
 * What each thing the payment service tells us does to an order, inside the transaction `handleOnce` opened. The
 * objects come from the payment service as they are now (re-fetched), never as an event carried them.
 */
import type { Transaction } from 'sequelize'
import type Stripe from 'stripe'
import { CoreReturn, Order, OrderLine } from '../../models/orders'
import { PartReturn } from '../../models/counter'
import { audit } from '../../utils/audit'
import type { Formats } from '../../../shared/utils/format'
import { bookOrderCharges, creditCancelledOrder } from '../orders/ledger'
import { mailOrder } from '../orders/mail'
import { mayPay } from '../orders/rules'
import { releaseStock, reserveStock, stockSuffices } from '../orders/stock'
import type { Effect } from './record-once'
import { issueOrderRefund, recordCoreRefund, recordOrderRefund, recordReturnRefund } from './refunds'

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === 'string' ? v : v.id)

export function orderIdFrom(metadata: Stripe.Metadata | null | undefined, fallback?: string | null): number | null {
  const n = Number(metadata?.orderId ?? fallback ?? NaN)
  return Number.isSafeInteger(n) && n > 0 ? n : null
}

/** Why a completed checkout does not settle this order (amount, currency or order id differ), if it does not. */
function mismatches(order: Order, s: Stripe.Checkout.Session): string[] {
  const problems: string[] = []
  if (s.amount_total !== order.totalMinor) problems.push(`amount ${s.amount_total} is not the order's ${order.totalMinor}`)
  if ((s.currency ?? '').toLowerCase() !== order.currency.toLowerCase()) problems.push(`currency ${s.currency} is not ${order.currency}`)
  if (s.metadata?.orderId !== String(order.id) || s.client_reference_id !== String(order.id)) problems.push('order id does not match')
  return problems
}

/** A checkout the payment service says is complete and paid: check it against the order, then mark it paid. */
export async function applyPaid(t: Transaction, order: Order | null, s: Stripe.Checkout.Session, fmt: Formats): Promise<Effect> {
  if (!order) return { outcome: 'no such order' }
  if (s.status !== 'complete' || s.payment_status !== 'paid') return { outcome: `not paid (${s.status}, ${s.payment_status})` }
  const problems = mismatches(order, s)
  if (problems.length) {
    console.error(`[boreline] checkout ${s.id} refused for order ${order.id}: ${problems.join('; ')}`)
    await audit(t, { actorUserId: null, organisationId: order.organisationId, action: 'order.payment_refused', entity: 'order', entityId: order.id, changes: { session: s.id, problems } })
    return { outcome: `refused: ${problems.join('; ')}` }
  }
  if (order.paymentState !== 'unpaid') return { outcome: `already ${order.paymentState}` }
  const pi = idOf(s.payment_intent)
  if (order.status === 'cancelled') return paidButCancelled(t, order, pi, null, fmt)
  if (order.status !== 'awaiting_payment' && order.status !== 'lapsed') return { outcome: `ignored: order is ${order.status}` }
  if (!order.stockHeld) {
    // the checkout lapsed and released the stock, then the payment went through after all: take it again
    if (!await stockSuffices(t, order)) return paidButCancelled(t, order, pi, 'The parts were no longer in stock when the payment arrived.', fmt)
    await reserveStock(t, order.branch!, order.lines ?? [])
    order.stockHeld = true
  }
  order.set({ status: 'confirmed', paymentState: 'paid', paidAt: new Date(), paymentIntentId: pi, checkoutSessionId: s.id, declineReason: null, declineCode: null })
  await order.save({ transaction: t })
  await bookOrderCharges(t, order, pi, fmt)
  await audit(t, { actorUserId: null, organisationId: order.organisationId, action: 'order.paid', entity: 'order', entityId: order.id, changes: { session: s.id, paymentIntent: pi, amountMinor: s.amount_total } })
  return { outcome: 'paid', after: [() => mailOrder(order.id, 'paid', fmt)] }
}

/** Money arrived for an order that no longer stands: book it, credit it and send it back. */
async function paidButCancelled(t: Transaction, order: Order, pi: string | null, reason: string | null, fmt: Formats): Promise<Effect> {
  order.paymentIntentId = pi
  order.paymentState = 'refund_pending'
  if (order.status !== 'cancelled') {
    order.status = 'cancelled'
    order.cancelledAt = new Date()
    order.cancelReason = reason
  }
  order.cancelledMinor = order.totalMinor
  await order.save({ transaction: t })
  await OrderLine.update({ state: 'cancelled' }, { where: { orderId: order.id, state: ['reserved', 'waiting', 'picked'] }, transaction: t })
  await bookOrderCharges(t, order, pi, fmt)
  await creditCancelledOrder(t, order)
  return {
    outcome: 'paid after cancellation: refunding',
    after: [() => issueOrderRefund(order.id, fmt), () => mailOrder(order.id, 'cancelled', fmt, { reason: reason ?? undefined })],
  }
}

/** An unpaid card order gives its stock back and waits for the garage to pay again. */
export async function lapseOrder(t: Transaction, order: Order, fmt: Formats): Promise<Effect> {
  await releaseStock(t, order)
  order.status = 'lapsed'
  await order.save({ transaction: t })
  return { outcome: 'lapsed: stock released', after: [() => mailOrder(order.id, 'lapsed', fmt)] }
}

export async function applyExpired(t: Transaction, order: Order | null, s: Stripe.Checkout.Session, fmt: Formats): Promise<Effect> {
  if (!order) return { outcome: 'no such order' }
  if (s.status !== 'expired') return { outcome: `not expired (${s.status})` }
  if (order.status !== 'awaiting_payment' || order.checkoutSessionId !== s.id) return { outcome: `ignored: order is ${order.status}` }
  return lapseOrder(t, order, fmt)
}

export async function applyDeclined(t: Transaction, order: Order | null, pi: Stripe.PaymentIntent): Promise<Effect> {
  if (!order) return { outcome: 'no such order' }
  // the intent as it is now decides: a later success wins over an older decline that arrives late
  if (pi.status === 'succeeded' || pi.status === 'processing' || pi.status === 'requires_capture') return { outcome: `ignored: intent is ${pi.status}` }
  if (order.paymentState !== 'unpaid' || !mayPay(order)) return { outcome: `ignored: order is ${order.status}` }
  const e = pi.last_payment_error
  order.declineReason = e?.message ?? 'The card was declined.'
  order.declineCode = e?.decline_code ?? e?.code ?? null
  order.declinedAt = new Date()
  await order.save({ transaction: t })
  return { outcome: `declined: ${order.declineCode ?? 'card_declined'}` }
}

export async function applyRefund(t: Transaction, refund: Stripe.Refund): Promise<Effect> {
  if (refund.status === 'failed' || refund.status === 'canceled') return { outcome: `ignored: refund ${refund.status}` }
  const purpose = refund.metadata?.purpose
  if (purpose === 'core') {
    const cr = await CoreReturn.findByPk(Number(refund.metadata?.coreReturnId), { transaction: t })
    if (!cr) return { outcome: 'no such core return' }
    await recordCoreRefund(t, cr, refund)
    return { outcome: 'core refund booked' }
  }
  if (purpose === 'return') {
    const r = await PartReturn.findByPk(Number(refund.metadata?.returnId), { transaction: t })
    if (!r) return { outcome: 'no such return' }
    await recordReturnRefund(t, r, refund)
    return { outcome: 'return refund booked' }
  }
  const order = await Order.findByPk(orderIdFrom(refund.metadata) ?? 0, { transaction: t })
  if (!order || purpose !== 'order') return { outcome: 'not ours' }
  await recordOrderRefund(t, order, refund)
  return { outcome: 'refund booked' }
}
