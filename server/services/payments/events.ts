/**
 * A verified webhook event from the payment service. The object it names is re-fetched rather than trusted as it
 * arrived (events may come twice, late and out of order); unknown types are acknowledged and ignored.
 */
import Stripe from 'stripe'
import { PaymentEvent } from '../../models/orders'
import { useStripe } from '../../utils/stripe'
import type { Formats } from '../../../shared/utils/format'
import { applyDeclined, applyExpired, applyPaid, applyRefund, orderIdFrom } from './effects'
import { handleOnce, type EventRef, type Handled } from './record-once'
import { accountPaymentOrg, settleAccountCardPayment } from './account-card'

/** Settles a completed checkout (from the webhook, the sweep, or a returning browser). */
export function settleSession(s: Stripe.Checkout.Session, evt: EventRef | null, fmt: Formats): Promise<Handled> {
  return handleOnce(evt, orderIdFrom(s.metadata, s.client_reference_id), (t, order) => applyPaid(t, order, s, fmt))
}

/** Ends an expired checkout's hold on the stock (from the webhook or the sweep). */
export function expireSession(s: Stripe.Checkout.Session, evt: EventRef | null, fmt: Formats, orderId = orderIdFrom(s.metadata, s.client_reference_id)): Promise<Handled> {
  return handleOnce(evt, orderId, (t, order) => applyExpired(t, order, s, fmt))
}

export async function handleStripeEvent(evt: Stripe.Event, fmt: Formats): Promise<Handled> {
  const seen = await PaymentEvent.findOne({ where: { eventId: evt.id } })
  if (seen) return { duplicate: true, outcome: seen.outcome }
  const ref = { id: evt.id, type: evt.type }
  try {
    return await dispatchEvent(useStripe(), evt, ref, fmt)
  } catch (err) {
    // the object the event names does not exist at the payment service: nothing to do, and no point retrying
    if (err instanceof Stripe.errors.StripeInvalidRequestError && err.statusCode === 404) {
      return handleOnce(ref, null, async () => ({ outcome: 'ignored: no such object at the payment service' }))
    }
    throw err
  }
}

async function dispatchEvent(stripe: Stripe, evt: Stripe.Event, ref: EventRef, fmt: Formats): Promise<Handled> {
  switch (evt.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const s = await stripe.checkout.sessions.retrieve(evt.data.object.id)
      // a payment on the trade account rather than for an order
      return accountPaymentOrg(s) ? settleAccountCardPayment(s, ref, fmt) : settleSession(s, ref, fmt)
    }
    case 'checkout.session.expired':
      return expireSession(await stripe.checkout.sessions.retrieve(evt.data.object.id), ref, fmt)
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
