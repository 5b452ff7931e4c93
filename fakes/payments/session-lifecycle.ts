/**
 * How a Checkout Session ends: paid with a card (from the hosted page or the complete control route), or
 * expired (by the API, a control route or the fake clock passing `expires_at`).
 */
import { classifyCard } from './cards'
import { chargeIntent, newIntent } from './charges'
import type { Fake, RequestContext } from './context'
import { stateError } from './errors'
import { emit } from './events'
import { clone, randomId, type DeliveryAttempt } from './store'
import type { CheckoutSession, PaymentIntent } from './types'

export function expireSession(fake: Fake, session: CheckoutSession, ctx: RequestContext | null): Promise<DeliveryAttempt | null> {
  session.status = 'expired'
  session.url = null
  // API reference (from memory): an expired session's payment intent, if one was started, is canceled
  const pi = typeof session.payment_intent === 'string' ? fake.state.paymentIntents.get(session.payment_intent) : undefined
  if (pi && pi.status !== 'succeeded' && pi.status !== 'canceled') {
    pi.status = 'canceled'
    pi.canceled_at = fake.now()
    pi.cancellation_reason = 'abandoned'
  }
  return emit(fake, 'checkout.session.expired', session, ctx).delivered
}

/**
 * Expires every open session whose `expires_at` has passed on the fake clock. There is no timer: every request
 * that could see a session sweeps first, so a moved clock shows at once.
 */
export function sweepExpired(fake: Fake): { ids: string[]; delivered: Promise<unknown>[] } {
  const ids: string[] = []
  const delivered: Promise<unknown>[] = []
  const t = fake.now()
  for (const s of fake.state.sessions.values()) {
    if (s.status === 'open' && s.expires_at <= t) {
      ids.push(s.id)
      delivered.push(expireSession(fake, s, null))
    }
  }
  return { ids, delivered }
}

export interface PayResult {
  ok: boolean
  /** set when the number is not a card number at all; no payment was attempted */
  invalid?: string
  session: CheckoutSession
  intent?: PaymentIntent
  delivered?: Promise<DeliveryAttempt | null>
}

/** One payment attempt on a Checkout Session, as the hosted page (or the complete control route) makes it. */
export function paySession(fake: Fake, session: CheckoutSession, cardInput: string): PayResult {
  const { state } = fake
  if (session.status !== 'open') throw stateError(`This Checkout Session is no longer open (status: ${session.status}).`, 'checkout_session_not_open')
  const card = classifyCard(cardInput)
  if (!card) return { ok: false, invalid: 'Your card number is invalid.', session }
  // The intent is created at the first attempt and reused by later ones (payment_intent stays null
  // before the customer submits a card: API reference, from memory, for current API versions).
  let pi = typeof session.payment_intent === 'string' ? state.paymentIntents.get(session.payment_intent) : undefined
  if (!pi) {
    const data = state.intentData.get(session.id)
    pi = newIntent(fake, {
      amount: session.amount_total,
      currency: session.currency,
      metadata: clone(data?.metadata ?? {}),
      description: data?.description ?? null,
      receiptEmail: data?.receiptEmail ?? null,
    })
    state.sessionOfIntent.set(pi.id, session.id)
    session.payment_intent = pi.id
  }
  chargeIntent(fake, pi, card, randomId('pm_'))
  if (!card.ok) {
    const delivered = emit(fake, 'payment_intent.payment_failed', pi, null).delivered
    return { ok: false, session, intent: pi, delivered }
  }
  session.status = 'complete'
  session.payment_status = 'paid'
  session.url = null
  session.customer_details = { email: session.customer_email }
  const delivered = emit(fake, 'checkout.session.completed', session, null).delivered
  return { ok: true, session, intent: pi, delivered }
}

/** Where the customer goes after paying: `{CHECKOUT_SESSION_ID}` is replaced by the session id (observed SDK behaviour). */
export function successUrl(session: CheckoutSession): string {
  return (session.success_url ?? '').split('{CHECKOUT_SESSION_ID}').join(session.id)
}
