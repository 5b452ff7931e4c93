/**
 * Card checkout for a garage's own order through the payment service. An open checkout is reused, so after a
 * declined card the garage simply tries again on the same page; a lapsed order takes its stock again first.
 */
import type Stripe from 'stripe'
import type { User } from '../../models/accounts'
import { Order } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { appLink } from '../../utils/mail'
import { stripeProblem, useStripe } from '../../utils/stripe'
import { ORDER_STATUS_LABELS, orderReference } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { DomainError, conflict } from '../errors'
import { findGarageOrder } from '../orders/find'
import { mayPay } from '../orders/rules'
import { reserveStock } from '../orders/stock'
import { settleSession } from './events'
import { orderKey } from './keys'

function paymentServiceDown(err: unknown): Error {
  console.error('[boreline] payment service error:', stripeProblem(err))
  return new DomainError('upstream', 'The card payment service did not answer properly, so nothing was charged. Please try again in a moment.')
}

function assertPayable(o: Order): void {
  if (o.paymentMethod !== 'card') throw conflict('This order is on the trade account: there is nothing to pay by card.')
  if (o.paymentState !== 'unpaid') throw conflict('This order is already paid.')
  if (!mayPay(o)) throw conflict(`This order can no longer be paid (${ORDER_STATUS_LABELS[o.status].toLowerCase()}).`)
}

/** What the checkout lists: each part line, each deposit, the tax; they add up to the order's total. */
function checkoutLineItems(order: Order): Stripe.Checkout.SessionCreateParams.LineItem[] {
  const currency = order.currency.toLowerCase()
  const item = (quantity: number, unit: number, name: string): Stripe.Checkout.SessionCreateParams.LineItem =>
    ({ quantity, price_data: { currency, unit_amount: unit, product_data: { name: name.slice(0, 250) } } })
  const lines = [...(order.lines ?? [])].sort((a, b) => a.position - b.position)
  const items = [
    ...lines.map((l) => item(l.quantity, l.unitNetMinor, `${l.sku} ${l.description}`)),
    ...lines.filter((l) => l.coreDepositUnitMinor > 0).map((l) => item(l.quantity, l.coreDepositUnitMinor, `Core deposit, ${l.sku} (returned with the old unit)`)),
    ...(order.taxMinor > 0 ? [item(1, order.taxMinor, `VAT ${order.taxRateBp / 100} %`)] : []),
  ]
  const sum = items.reduce((s, i) => s + (i.price_data!.unit_amount ?? 0) * (i.quantity ?? 1), 0)
  if (sum !== order.totalMinor) throw new Error(`checkout items add up to ${sum}, the order to ${order.totalMinor}`)
  return items
}

/** The checkout already open for the order, when there is one to send the browser back to (or it was paid). */
async function openCheckout(order: Order, fmt: Formats): Promise<{ url: string; alreadyPaid: boolean } | null> {
  if (order.status !== 'awaiting_payment' || !order.checkoutSessionId) return null
  let s: Stripe.Checkout.Session
  try {
    s = await useStripe().checkout.sessions.retrieve(order.checkoutSessionId)
  } catch (err) {
    throw paymentServiceDown(err)
  }
  if (s.status === 'open' && s.url) return { url: s.url, alreadyPaid: false }
  if (s.status === 'complete') {
    await settleSession(s, null, fmt)
    return { url: appLink(`/orders/${order.id}`), alreadyPaid: true }
  }
  // expired without its webhook reaching us yet: the order still holds its stock; open a new checkout
  return null
}

/** Readies the order for a new checkout: a lapsed order takes its stock again (409 "Only N left" when it has gone). */
function prepareAttempt(orgId: number, orderId: number): Promise<Order> {
  return withWrite(async (t) => {
    const o = await findGarageOrder(orgId, orderId, t)
    assertPayable(o)
    if (o.status === 'lapsed') {
      await reserveStock(t, o.branch!, o.lines ?? [])
      o.stockHeld = true
      o.status = 'awaiting_payment'
    }
    if (o.checkoutSessionId) {
      o.checkoutSessionId = null
      o.checkoutAttempt = (o.checkoutAttempt ?? 0) + 1
    }
    await o.save({ transaction: t })
    return o
  })
}

/** Opens (or reopens) the card checkout of a garage's own order and returns where to send the browser. */
export async function startCheckout(orgId: number, orderId: number, user: Pick<User, 'email'>, fmt: Formats): Promise<{ url: string; alreadyPaid: boolean }> {
  const current = await findGarageOrder(orgId, orderId)
  assertPayable(current)
  const reopened = await openCheckout(current, fmt)
  if (reopened) return reopened
  const order = await prepareAttempt(orgId, orderId)
  const reference = orderReference(order.id)
  const back = appLink(`/orders/${order.id}`)
  let session: Stripe.Checkout.Session
  try {
    session = await useStripe().checkout.sessions.create({
      mode: 'payment',
      line_items: checkoutLineItems(order),
      client_reference_id: String(order.id),
      metadata: { orderId: String(order.id), reference },
      payment_intent_data: { metadata: { orderId: String(order.id), reference }, description: `Boreline order ${reference}` },
      customer_email: user.email,
      success_url: `${back}?checkout=done&session_id={CHECKOUT_SESSION_ID}`,
      cancel_url: `${back}?checkout=left`,
    }, { idempotencyKey: `${orderKey(order)}-checkout-${order.checkoutAttempt ?? 0}` })
  } catch (err) {
    throw paymentServiceDown(err)
  }
  const stored = await withWrite(async (t) => {
    const o = await Order.findByPk(order.id, { transaction: t })
    if (!o || o.status !== 'awaiting_payment' || (o.checkoutSessionId && o.checkoutSessionId !== session.id)) return false
    o.checkoutSessionId = session.id
    await o.save({ transaction: t })
    return true
  })
  if (!stored) {
    await useStripe().checkout.sessions.expire(session.id).catch(() => {})
    throw conflict('This order changed while the checkout was being opened. Reload the order.')
  }
  if (!session.url) throw paymentServiceDown(new Error('checkout session without a url'))
  return { url: session.url, alreadyPaid: false }
}
