/**
 * Card payments through the payment service (the `stripe` SDK; the local fake in development and tests):
 * opening a checkout for an order, what each signed webhook event does, refunds, cancellations, the counter's
 * moves, and the periodic sweep that reconciles what a lost webhook would have told us. Nitro only.
 *
 * Every state change runs in one write transaction; the webhook's event id is recorded in that same
 * transaction (payment_events.event_id is UNIQUE), so a redelivered event changes nothing. Calls to the
 * payment service and e-mails happen after the commit (`After` tasks); a refund that could not be sent stays
 * `refund_pending` and the sweep sends it later, under the same idempotency key.
 */
import Stripe from 'stripe'
import { Op, UniqueConstraintError, type Transaction } from 'sequelize'
import type { User } from '../models/accounts'
import { StockLevel } from '../models/catalogue'
import { CoreReturn, LedgerEntry, Order, OrderLine, PaymentEvent } from '../models/orders'
import { withWrite } from '../utils/db'
import { appLink } from '../utils/mail'
import { audit } from '../utils/audit'
import { useStripe, stripeProblem } from '../utils/stripe'
import { bookOrderCharges, findGarageOrder, mayPay, orderIncludes, releaseStock, reserveStock, UNPAID_HOLD_MINUTES } from './orders'
import { mailCoreReturn, mailOrder } from './order-mail'
import { deliveryNotePdf } from './order-pdf'
import { COUNTER_MOVES, ORDER_STATUS_LABELS, orderReference, type OrderStatus } from '../../shared/types/orders'
import { DomainError, notFound, conflict } from './errors'

export type After = (() => Promise<unknown>)[]

/** Runs the after-commit tasks in order; a failure is logged and never undoes the committed change. */
export async function runAfter(tasks: After): Promise<void> {
  for (const task of tasks) {
    try {
      await task()
    } catch (err) {
      console.error('[boreline] after-commit task failed:', stripeProblem(err))
    }
  }
}

function paymentServiceDown(err: unknown): Error {
  console.error('[boreline] payment service error:', stripeProblem(err))
  return new DomainError('upstream', 'The card payment service did not answer properly, so nothing was charged. Please try again in a moment.')
}

const orderKey = (o: Pick<Order, 'id' | 'createdAt'>) => `boreline-order-${o.id}-${o.createdAt.getTime()}`

// ---------------------------------------------------------------------------------------------------------
// Checkout
// ---------------------------------------------------------------------------------------------------------

/** What the checkout lists: each part line, each deposit, the tax; they add up to the order's total. */
function checkoutLineItems(order: Order): Stripe.Checkout.SessionCreateParams.LineItem[] {
  const currency = order.currency.toLowerCase()
  const lines = [...(order.lines ?? [])].sort((a, b) => a.position - b.position)
  const items: Stripe.Checkout.SessionCreateParams.LineItem[] = lines.map((l) => ({
    quantity: l.quantity,
    price_data: { currency, unit_amount: l.unitNetMinor, product_data: { name: `${l.sku} ${l.description}`.slice(0, 250) } },
  }))
  for (const l of lines) {
    if (l.coreDepositUnitMinor > 0) {
      items.push({ quantity: l.quantity, price_data: { currency, unit_amount: l.coreDepositUnitMinor, product_data: { name: `Core deposit, ${l.sku} (returned with the old unit)` } } })
    }
  }
  if (order.taxMinor > 0) {
    items.push({ quantity: 1, price_data: { currency, unit_amount: order.taxMinor, product_data: { name: `VAT ${order.taxRateBp / 100} %` } } })
  }
  const sum = items.reduce((s, i) => s + (i.price_data!.unit_amount ?? 0) * (i.quantity ?? 1), 0)
  if (sum !== order.totalMinor) throw new Error(`checkout items add up to ${sum}, the order to ${order.totalMinor}`)
  return items
}

/**
 * Opens (or reopens) the card checkout of a garage's own order and returns where to send the browser.
 * An open checkout is reused, so after a declined card the garage simply tries again on the same page.
 * A lapsed order takes its stock again first (409 "Only N left" when it has gone meanwhile).
 */
export async function startCheckout(orgId: number, orderId: number, user: Pick<User, 'email'>): Promise<{ url: string; alreadyPaid: boolean }> {
  const stripe = useStripe()
  const current = await findGarageOrder(orgId, orderId)
  assertPayable(current)
  if (current.status === 'awaiting_payment' && current.checkoutSessionId) {
    let s: Stripe.Checkout.Session
    try {
      s = await stripe.checkout.sessions.retrieve(current.checkoutSessionId)
    } catch (err) {
      throw paymentServiceDown(err)
    }
    if (s.status === 'open' && s.url) return { url: s.url, alreadyPaid: false }
    if (s.status === 'complete') {
      await settleSession(s, null)
      return { url: appLink(`/orders/${orderId}`), alreadyPaid: true }
    }
    // expired without its webhook reaching us yet: the order still holds its stock; open a new checkout
  }
  const order = await withWrite(async (t) => {
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
  const reference = orderReference(order.id)
  let session: Stripe.Checkout.Session
  try {
    session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: checkoutLineItems(order),
      client_reference_id: String(order.id),
      metadata: { orderId: String(order.id), reference },
      payment_intent_data: { metadata: { orderId: String(order.id), reference }, description: `Boreline order ${reference}` },
      customer_email: user.email,
      success_url: `${appLink(`/orders/${order.id}`)}?checkout=done&session_id={CHECKOUT_SESSION_ID}`,
      cancel_url: `${appLink(`/orders/${order.id}`)}?checkout=left`,
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
    await stripe.checkout.sessions.expire(session.id).catch(() => {})
    throw conflict('This order changed while the checkout was being opened. Reload the order.')
  }
  if (!session.url) throw paymentServiceDown(new Error('checkout session without a url'))
  return { url: session.url, alreadyPaid: false }
}

function assertPayable(o: Order): void {
  if (o.paymentMethod !== 'card') throw conflict('This order is on the trade account: there is nothing to pay by card.')
  if (o.paymentState !== 'unpaid') throw conflict('This order is already paid.')
  if (!mayPay(o)) throw conflict(`This order can no longer be paid (${ORDER_STATUS_LABELS[o.status].toLowerCase()}).`)
}

// ---------------------------------------------------------------------------------------------------------
// Events
// ---------------------------------------------------------------------------------------------------------

interface Effect { outcome: string; after?: After }

/**
 * One event's effects in one write transaction, recorded under its id (once: a duplicate is acknowledged
 * and changes nothing). `evt` null = a reconciliation by the sweep or the checkout route (not recorded).
 */
async function handleOnce(evt: { id: string; type: string } | null, orderId: number | null, effect: (t: Transaction, order: Order | null) => Promise<Effect>): Promise<{ duplicate: boolean; outcome: string }> {
  const after: After = []
  let result: { duplicate: boolean; outcome: string }
  try {
    result = await withWrite(async (t) => {
      if (evt) {
        const seen = await PaymentEvent.findOne({ where: { eventId: evt.id }, transaction: t })
        if (seen) return { duplicate: true, outcome: seen.outcome }
      }
      const order = orderId ? await Order.findByPk(orderId, { include: orderIncludes(), transaction: t }) : null
      const r = await effect(t, order)
      if (evt) await PaymentEvent.create({ eventId: evt.id, type: evt.type, orderId: order?.id ?? null, outcome: r.outcome.slice(0, 200) }, { transaction: t })
      after.push(...(r.after ?? []))
      return { duplicate: false, outcome: r.outcome }
    })
  } catch (err) {
    if (err instanceof UniqueConstraintError) return { duplicate: true, outcome: 'duplicate' }
    throw err
  }
  if (!result.duplicate) await runAfter(after)
  return result
}

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === 'string' ? v : v.id)

function orderIdFrom(metadata: Stripe.Metadata | null | undefined, fallback?: string | null): number | null {
  const n = Number(metadata?.orderId ?? fallback ?? NaN)
  return Number.isSafeInteger(n) && n > 0 ? n : null
}

/** Are there enough units at the branch for every line (inside the write lock, so nothing moves meanwhile)? */
async function stockSuffices(t: Transaction, order: Order): Promise<boolean> {
  for (const l of order.lines ?? []) {
    const row = await StockLevel.findOne({ where: { partId: l.partId, branchId: order.branchId }, transaction: t })
    if ((row?.quantity ?? 0) < l.quantity) return false
  }
  return true
}

/** A checkout the payment service says is complete and paid: check it against the order, then mark it paid. */
async function applyPaid(t: Transaction, order: Order | null, s: Stripe.Checkout.Session): Promise<Effect> {
  if (!order) return { outcome: 'no such order' }
  if (s.status !== 'complete' || s.payment_status !== 'paid') return { outcome: `not paid (${s.status}, ${s.payment_status})` }
  const problems: string[] = []
  if (s.amount_total !== order.totalMinor) problems.push(`amount ${s.amount_total} is not the order's ${order.totalMinor}`)
  if ((s.currency ?? '').toLowerCase() !== order.currency.toLowerCase()) problems.push(`currency ${s.currency} is not ${order.currency}`)
  if (s.metadata?.orderId !== String(order.id) || s.client_reference_id !== String(order.id)) problems.push('order id does not match')
  if (problems.length) {
    console.error(`[boreline] checkout ${s.id} refused for order ${order.id}: ${problems.join('; ')}`)
    await audit(t, { actorUserId: null, organisationId: order.organisationId, action: 'order.payment_refused', entity: 'order', entityId: order.id, changes: { session: s.id, problems } })
    return { outcome: `refused: ${problems.join('; ')}` }
  }
  if (order.paymentState !== 'unpaid') return { outcome: `already ${order.paymentState}` }
  const pi = idOf(s.payment_intent)
  const after: After = []
  if (order.status === 'awaiting_payment' || order.status === 'lapsed') {
    if (!order.stockHeld) {
      // the checkout lapsed and released the stock, then the payment went through after all: take it again
      if (await stockSuffices(t, order)) {
        await reserveStock(t, order.branch!, order.lines ?? [])
        order.stockHeld = true
      } else {
        return paidButCancelled(t, order, pi, 'The parts were no longer in stock when the payment arrived.')
      }
    }
    order.status = 'confirmed'
    order.paymentState = 'paid'
    order.paidAt = new Date()
    order.paymentIntentId = pi
    order.checkoutSessionId = s.id
    order.declineReason = null
    order.declineCode = null
    await order.save({ transaction: t })
    await bookOrderCharges(t, order, pi)
    await audit(t, { actorUserId: null, organisationId: order.organisationId, action: 'order.paid', entity: 'order', entityId: order.id, changes: { session: s.id, paymentIntent: pi, amountMinor: s.amount_total } })
    after.push(() => mailOrder(order.id, 'paid'))
    return { outcome: 'paid', after }
  }
  if (order.status === 'cancelled') return paidButCancelled(t, order, pi, null)
  return { outcome: `ignored: order is ${order.status}` }
}

/** Money arrived for an order that no longer stands: book it, credit it and send it back. */
async function paidButCancelled(t: Transaction, order: Order, pi: string | null, reason: string | null): Promise<Effect> {
  order.paymentIntentId = pi
  order.paymentState = 'refund_pending'
  if (order.status !== 'cancelled') {
    order.status = 'cancelled'
    order.cancelledAt = new Date()
    order.cancelReason = reason
  }
  await order.save({ transaction: t })
  await bookOrderCharges(t, order, pi, { expectCores: false })
  await LedgerEntry.create({
    organisationId: order.organisationId, orderId: order.id, kind: 'credit', amountMinor: -order.totalMinor,
    reference: orderReference(order.id), description: 'Order cancelled: payment to be refunded',
  }, { transaction: t })
  return { outcome: 'paid after cancellation: refunding', after: [() => issueOrderRefund(order.id), () => mailOrder(order.id, 'cancelled', { reason: reason ?? undefined })] }
}

async function applyExpired(t: Transaction, order: Order | null, s: Stripe.Checkout.Session): Promise<Effect> {
  if (!order) return { outcome: 'no such order' }
  if (s.status !== 'expired') return { outcome: `not expired (${s.status})` }
  if (order.status !== 'awaiting_payment' || order.checkoutSessionId !== s.id) return { outcome: `ignored: order is ${order.status}` }
  await releaseStock(t, order)
  order.status = 'lapsed'
  await order.save({ transaction: t })
  return { outcome: 'lapsed: stock released', after: [() => mailOrder(order.id, 'lapsed')] }
}

async function applyDeclined(t: Transaction, order: Order | null, pi: Stripe.PaymentIntent): Promise<Effect> {
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

async function recordOrderRefund(t: Transaction, order: Order, refund: Stripe.Refund): Promise<void> {
  const booked = await LedgerEntry.findOne({ where: { kind: 'refund', externalId: refund.id }, transaction: t })
  if (!booked) {
    await LedgerEntry.create({
      organisationId: order.organisationId, orderId: order.id, kind: 'refund', amountMinor: refund.amount,
      reference: orderReference(order.id), description: 'Refund sent to the card', externalId: refund.id,
    }, { transaction: t })
  }
  if (order.paymentState === 'refund_pending') {
    order.paymentState = 'refunded'
    order.refundId = refund.id
    await order.save({ transaction: t })
  }
}

async function recordCoreRefund(t: Transaction, cr: CoreReturn, refund: Stripe.Refund): Promise<void> {
  const booked = await LedgerEntry.findOne({ where: { kind: 'refund', externalId: refund.id }, transaction: t })
  if (!booked) {
    await LedgerEntry.create({
      organisationId: cr.organisationId, orderId: cr.orderId, coreReturnId: cr.id, kind: 'refund', amountMinor: refund.amount,
      reference: orderReference(cr.orderId), description: 'Core deposit refunded to the card', externalId: refund.id,
    }, { transaction: t })
  }
  if (cr.refundPending) {
    cr.refundPending = false
    cr.refundId = refund.id
    await cr.save({ transaction: t })
  }
}

async function applyRefund(t: Transaction, refund: Stripe.Refund): Promise<Effect> {
  if (refund.status === 'failed' || refund.status === 'canceled') return { outcome: `ignored: refund ${refund.status}` }
  const purpose = refund.metadata?.purpose
  if (purpose === 'core') {
    const cr = await CoreReturn.findByPk(Number(refund.metadata?.coreReturnId), { transaction: t })
    if (!cr) return { outcome: 'no such core return' }
    await recordCoreRefund(t, cr, refund)
    return { outcome: 'core refund booked' }
  }
  const order = await Order.findByPk(orderIdFrom(refund.metadata) ?? 0, { transaction: t })
  if (!order || purpose !== 'order') return { outcome: 'not ours' }
  await recordOrderRefund(t, order, refund)
  return { outcome: 'refund booked' }
}

/** Settles a completed checkout (from the webhook, the sweep, or a returning browser). */
export function settleSession(s: Stripe.Checkout.Session, evt: { id: string; type: string } | null) {
  return handleOnce(evt, orderIdFrom(s.metadata, s.client_reference_id), (t, order) => applyPaid(t, order, s))
}

/**
 * A verified webhook event. The object is re-fetched from the payment service rather than trusted as it
 * arrived (events may come twice, late and out of order). Unknown types are acknowledged and ignored.
 */
export async function handleStripeEvent(evt: Stripe.Event): Promise<{ duplicate: boolean; outcome: string }> {
  const stripe = useStripe()
  const seen = await PaymentEvent.findOne({ where: { eventId: evt.id } })
  if (seen) return { duplicate: true, outcome: seen.outcome }
  const ref = { id: evt.id, type: evt.type }
  try {
    return await dispatchEvent(stripe, evt, ref)
  } catch (err) {
    // the object the event names does not exist at the payment service: nothing to do, and no point retrying
    if (err instanceof Stripe.errors.StripeInvalidRequestError && err.statusCode === 404) {
      return handleOnce(ref, null, async () => ({ outcome: 'ignored: no such object at the payment service' }))
    }
    throw err
  }
}

async function dispatchEvent(stripe: Stripe, evt: Stripe.Event, ref: { id: string; type: string }): Promise<{ duplicate: boolean; outcome: string }> {
  switch (evt.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const s = await stripe.checkout.sessions.retrieve(evt.data.object.id)
      return settleSession(s, ref)
    }
    case 'checkout.session.expired': {
      const s = await stripe.checkout.sessions.retrieve(evt.data.object.id)
      return handleOnce(ref, orderIdFrom(s.metadata, s.client_reference_id), (t, order) => applyExpired(t, order, s))
    }
    case 'payment_intent.payment_failed': {
      const pi = await stripe.paymentIntents.retrieve(evt.data.object.id)
      return handleOnce(ref, orderIdFrom(pi.metadata), (t, order) => applyDeclined(t, order, pi))
    }
    case 'refund.created':
    case 'refund.updated': {
      const r = await stripe.refunds.retrieve(evt.data.object.id)
      return handleOnce(ref, null, (t) => applyRefund(t, r))
    }
    default:
      return handleOnce(ref, null, async () => ({ outcome: 'ignored: not used' }))
  }
}

// ---------------------------------------------------------------------------------------------------------
// Refunds
// ---------------------------------------------------------------------------------------------------------

/** Sends the refund of a cancelled card order (once: the idempotency key is the order's). */
export async function issueOrderRefund(orderId: number): Promise<boolean> {
  const order = await Order.findByPk(orderId)
  if (!order || order.paymentState !== 'refund_pending' || !order.paymentIntentId) return false
  const refund = await useStripe().refunds.create({
    payment_intent: order.paymentIntentId, amount: order.totalMinor, reason: 'requested_by_customer',
    metadata: { orderId: String(order.id), purpose: 'order' },
  }, { idempotencyKey: `${orderKey(order)}-refund` })
  await withWrite(async (t) => {
    const o = await Order.findByPk(orderId, { transaction: t })
    if (o) await recordOrderRefund(t, o, refund)
  })
  await mailOrder(order.id, 'refunded', { amountMinor: refund.amount })
  return true
}

/** Sends an accepted core return's deposit back to the card the order was paid with. */
export async function issueCoreRefund(coreReturnId: number): Promise<boolean> {
  const cr = await CoreReturn.findByPk(coreReturnId, { include: [{ model: Order, as: 'order' }] })
  if (!cr || !cr.refundPending || !cr.order?.paymentIntentId || !cr.creditedMinor) return false
  const refund = await useStripe().refunds.create({
    payment_intent: cr.order.paymentIntentId, amount: cr.creditedMinor,
    metadata: { orderId: String(cr.orderId), coreReturnId: String(cr.id), purpose: 'core' },
  }, { idempotencyKey: `boreline-core-return-${cr.id}-${cr.createdAt.getTime()}-refund` })
  await withWrite(async (t) => {
    const row = await CoreReturn.findByPk(coreReturnId, { transaction: t })
    if (row) await recordCoreRefund(t, row, refund)
  })
  return true
}

// ---------------------------------------------------------------------------------------------------------
// Cancelling and the counter's moves
// ---------------------------------------------------------------------------------------------------------

/**
 * Cancels an order inside the caller's transaction: its stock goes back, an account order is credited,
 * a paid card order is credited and its refund queued (sent after the commit), an open checkout is closed.
 */
export async function cancelOrder(t: Transaction, order: Order, actor: Pick<User, 'id'>, reason: string): Promise<After> {
  const was = order.status
  const after: After = []
  await releaseStock(t, order)
  order.status = 'cancelled'
  order.cancelledAt = new Date()
  order.cancelReason = reason || null
  order.cancelledByUserId = actor.id
  if (order.paymentState === 'paid' || order.paymentState === 'on_account') {
    await LedgerEntry.create({
      organisationId: order.organisationId, orderId: order.id, kind: 'credit', amountMinor: -order.totalMinor,
      reference: orderReference(order.id), description: order.paymentState === 'paid' ? 'Order cancelled: payment to be refunded' : 'Order cancelled: credited to the account',
    }, { transaction: t })
    if (order.paymentState === 'paid') {
      order.paymentState = 'refund_pending'
      after.push(() => issueOrderRefund(order.id))
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
  after.unshift(() => mailOrder(order.id, 'cancelled', { reason: reason || undefined }))
  return after
}

/** Counter staff move an order along the queue (or cancel it before it leaves). */
export async function moveOrder(orderId: number, to: OrderStatus, actor: Pick<User, 'id'>, reason: string): Promise<Order> {
  const after: After = []
  const order = await withWrite(async (t) => {
    const o = await Order.findByPk(orderId, { include: orderIncludes(), transaction: t })
    if (!o) throw notFound('Order')
    const allowed = COUNTER_MOVES[o.status] ?? []
    if (!allowed.includes(to)) {
      throw conflict(`This order is "${ORDER_STATUS_LABELS[o.status]}", so it cannot move to "${ORDER_STATUS_LABELS[to]}".${allowed.length ? ` It can move to: ${allowed.map((s) => `"${ORDER_STATUS_LABELS[s]}"`).join(' or ')}.` : ''}`)
    }
    if (to === 'cancelled') {
      after.push(...await cancelOrder(t, o, actor, reason))
      return o
    }
    const now = new Date()
    if (to === 'picking') o.pickingAt = now
    if (to === 'dispatched') o.dispatchedAt = now
    if (to === 'delivered') o.deliveredAt = now
    const from = o.status
    o.status = to
    await o.save({ transaction: t })
    await audit(t, { actorUserId: actor.id, organisationId: o.organisationId, action: `order.${to}`, entity: 'order', entityId: o.id, changes: { from, to } })
    if (to === 'dispatched') {
      after.push(async () => {
        const pdf = await deliveryNotePdf(o.id)
        return mailOrder(o.id, 'dispatched', { attachments: [{ filename: `delivery-note-${orderReference(o.id)}.pdf`, content: pdf, contentType: 'application/pdf' }] })
      })
    } else {
      after.push(() => mailOrder(o.id, to as 'picking' | 'delivered'))
    }
    return o
  })
  await runAfter(after)
  return order
}

/** Core return decided by the counter: accepted credits (account) or refunds (card) the deposit. */
export async function decideCoreReturn(id: number, status: 'accepted' | 'rejected', reason: string, actor: Pick<User, 'id'>): Promise<CoreReturn> {
  const after: After = []
  const cr = await withWrite(async (t) => {
    const row = await CoreReturn.findByPk(id, { include: [{ model: Order, as: 'order' }, { model: OrderLine, as: 'line' }], transaction: t })
    if (!row || !row.order) throw notFound('Core return')
    if (row.status !== 'booked') {
      throw conflict(row.status === 'expected' ? 'The garage has not booked this old unit back yet.' : 'This core return has already been decided.')
    }
    row.status = status
    row.decidedAt = new Date()
    row.decidedByUserId = actor.id
    row.reason = reason || null
    if (status === 'accepted') {
      const credit = row.depositUnitMinor * (row.quantityBooked ?? row.quantityExpected)
      row.creditedMinor = credit
      await LedgerEntry.create({
        organisationId: row.organisationId, orderId: row.orderId, coreReturnId: row.id, kind: 'core_credit', amountMinor: -credit,
        reference: orderReference(row.orderId), description: `Old unit accepted: ${row.quantityBooked ?? row.quantityExpected} x ${row.line?.sku ?? ''}`.trim(),
      }, { transaction: t })
      if (row.order.paymentMethod === 'card' && credit > 0) {
        row.refundPending = true
        after.push(() => issueCoreRefund(row.id))
      }
    }
    await row.save({ transaction: t })
    await audit(t, { actorUserId: actor.id, organisationId: row.organisationId, action: `core_return.${status}`, entity: 'core_return', entityId: row.id, changes: { reason, creditedMinor: row.creditedMinor } })
    after.push(() => mailCoreReturn(row.id))
    return row
  })
  await runAfter(after)
  return cr
}

// ---------------------------------------------------------------------------------------------------------
// The sweep
// ---------------------------------------------------------------------------------------------------------

export interface SweepResult { paid: number; lapsed: number; refunds: number; coreRefunds: number; errors: number }

/**
 * Reconciles what lost or late webhooks would have told us: unpaid checkouts that completed or expired,
 * card orders that never opened a checkout (their stock is released after UNPAID_HOLD_MINUTES), and refunds
 * that could not be sent yet.
 */
export async function sweepOrders(now = new Date()): Promise<SweepResult> {
  const stripe = useStripe()
  const r: SweepResult = { paid: 0, lapsed: 0, refunds: 0, coreRefunds: 0, errors: 0 }
  const waiting = await Order.findAll({ where: { status: 'awaiting_payment', checkoutSessionId: { [Op.ne]: null } }, limit: 200 })
  for (const o of waiting) {
    try {
      const s = await stripe.checkout.sessions.retrieve(o.checkoutSessionId!)
      if (s.status === 'complete') {
        if ((await settleSession(s, null)).outcome === 'paid') r.paid++
      } else if (s.status === 'expired') {
        const res = await handleOnce(null, o.id, (t, order) => applyExpired(t, order, s))
        if (res.outcome.startsWith('lapsed')) r.lapsed++
      }
    } catch (err) {
      r.errors++
      console.error(`[boreline] sweep: order ${o.id}:`, stripeProblem(err))
    }
  }
  const stale = await Order.findAll({
    where: { status: 'awaiting_payment', checkoutSessionId: null, createdAt: { [Op.lt]: new Date(now.getTime() - UNPAID_HOLD_MINUTES * 60_000) } },
    limit: 200,
  })
  for (const o of stale) {
    const res = await handleOnce(null, o.id, async (t, order) => {
      if (!order || order.status !== 'awaiting_payment' || order.checkoutSessionId) return { outcome: 'ignored' }
      await releaseStock(t, order)
      order.status = 'lapsed'
      await order.save({ transaction: t })
      return { outcome: 'lapsed', after: [() => mailOrder(order.id, 'lapsed')] }
    })
    if (res.outcome === 'lapsed') r.lapsed++
  }
  for (const o of await Order.findAll({ where: { paymentState: 'refund_pending' }, limit: 200 })) {
    try {
      if (await issueOrderRefund(o.id)) r.refunds++
    } catch (err) {
      r.errors++
      console.error(`[boreline] sweep: refund of order ${o.id}:`, stripeProblem(err))
    }
  }
  for (const cr of await CoreReturn.findAll({ where: { refundPending: true }, limit: 200 })) {
    try {
      if (await issueCoreRefund(cr.id)) r.coreRefunds++
    } catch (err) {
      r.errors++
      console.error(`[boreline] sweep: core refund ${cr.id}:`, stripeProblem(err))
    }
  }
  return r
}

