/**
 * Card checkout for a garage's own order through the payment service. An open checkout is reused, so after a
 * declined card the garage simply tries again on the same page. A checkout stays open for the order's hold time
 * (runtime config `orderHoldMinutes`) and then expires, giving the stock back. A lapsed order is priced again first
 * (reprice.ts): when a price changed, the garage sees the new total (409) before paying it; otherwise it takes its
 * stock again.
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
import { repriceLapsedOrder } from '../orders/reprice'
import { reserveStock } from '../orders/stock'
import type { PriceChange } from '../orders/reprice'
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

/**
 * Readies the order for a new checkout: a lapsed order is priced again (returned as `repriced`, nothing else done,
 * when a price changed) and takes its stock again (409 "Only N left" when it has gone).
 */
function prepareAttempt(orgId: number, orderId: number, userId: number): Promise<{ order: Order; repriced: PriceChange | null }> {
  return withWrite(async (t) => {
    const o = await findGarageOrder(orgId, orderId, t)
    assertPayable(o)
    if (o.status === 'lapsed') {
      const repriced = await repriceLapsedOrder(t, o, userId)
      if (repriced) return { order: o, repriced }
      await reserveStock(t, o.branch!, o.lines ?? [])
      o.stockHeld = true
      o.status = 'awaiting_payment'
    }
    if (o.checkoutSessionId) {
      o.checkoutSessionId = null
      o.checkoutAttempt = (o.checkoutAttempt ?? 0) + 1
    }
    await o.save({ transaction: t })
    return { order: o, repriced: null }
  })
}

/**
 * Opens (or reopens) the card checkout of a garage's own order and returns where to send the browser; the checkout
 * expires after `holdMinutes`. 409 with `repriced` when a lapsed order's prices changed (the order now shows them).
 */
export async function startCheckout(orgId: number, orderId: number, user: Pick<User, 'id' | 'email'>, fmt: Formats, holdMinutes: number): Promise<{ url: string; alreadyPaid: boolean }> {
  const current = await findGarageOrder(orgId, orderId)
  assertPayable(current)
  const reopened = await openCheckout(current, fmt)
  if (reopened) return reopened
  const { order, repriced } = await prepareAttempt(orgId, orderId, user.id)
  if (repriced) {
    throw conflict(`Prices have changed since this order was placed: it now comes to ${fmt.money(repriced.totalMinor)} (it was ${fmt.money(repriced.previousTotalMinor)}). The order shows the new prices; pay again to go ahead.`, { repriced })
  }
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
      // the checkout closes when the hold ends (a minute's margin over the payment service's 30-minute minimum)
      expires_at: Math.floor(Date.now() / 1000) + holdMinutes * 60 + 60,
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
