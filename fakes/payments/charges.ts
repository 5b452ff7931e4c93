/**
 * The payment itself, shared by the hosted checkout and the PaymentIntents API: making an intent, charging a
 * card against it, and the card error a declined charge answers with.
 */
import { DECLINED, type CardOutcome } from './cards'
import type { Fake } from './context'
import { ApiError } from './errors'
import { clone, randomId } from './store'
import type { Charge, Metadata, PaymentError, PaymentIntent } from './types'

export interface NewIntent {
  amount: number
  currency: string
  metadata?: Metadata
  description?: string | null
  captureMethod?: string
  receiptEmail?: string | null
  paymentMethodTypes?: string[]
}

export function newIntent(fake: Fake, fields: NewIntent): PaymentIntent {
  const id = randomId('pi_')
  const pi: PaymentIntent = {
    id,
    object: 'payment_intent',
    amount: fields.amount,
    amount_capturable: 0,
    amount_received: 0,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: fields.captureMethod ?? 'automatic_async',
    client_secret: `${id}_secret_${randomId('', 24)}`,
    confirmation_method: 'automatic',
    created: fake.now(),
    currency: fields.currency,
    description: fields.description ?? null,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: fields.metadata ?? {},
    payment_method: null,
    payment_method_types: fields.paymentMethodTypes?.length ? fields.paymentMethodTypes : ['card'],
    receipt_email: fields.receiptEmail ?? null,
    status: 'requires_payment_method',
  }
  fake.state.paymentIntents.set(id, pi)
  return pi
}

/** Charges a card against an intent: success moves it on, a decline records `last_payment_error`. */
export function chargeIntent(fake: Fake, pi: PaymentIntent, card: CardOutcome, paymentMethodId: string): Charge {
  const charge: Charge = {
    id: randomId('ch_'),
    object: 'charge',
    amount: pi.amount,
    amount_captured: 0,
    amount_refunded: 0,
    captured: false,
    created: fake.now(),
    currency: pi.currency,
    failure_code: null,
    failure_message: null,
    livemode: false,
    metadata: {},
    paid: false,
    payment_intent: pi.id,
    payment_method: paymentMethodId,
    refunded: false,
    status: 'failed',
  }
  fake.state.charges.set(charge.id, charge)
  pi.payment_method = paymentMethodId
  pi.latest_charge = charge.id
  if (card.ok) {
    charge.status = 'succeeded'
    charge.paid = true
    pi.last_payment_error = null
    if (pi.capture_method === 'manual') {
      pi.status = 'requires_capture'
      pi.amount_capturable = pi.amount
    } else {
      charge.captured = true
      charge.amount_captured = pi.amount
      pi.status = 'succeeded'
      pi.amount_received = pi.amount
    }
  } else {
    charge.failure_code = card.code ?? 'card_declined'
    charge.failure_message = card.message ?? DECLINED
    pi.status = 'requires_payment_method'
    pi.last_payment_error = {
      type: 'card_error',
      code: card.code ?? 'card_declined',
      ...(card.declineCode ? { decline_code: card.declineCode } : {}),
      message: card.message ?? DECLINED,
      charge: charge.id,
      payment_method: { id: paymentMethodId, object: 'payment_method', type: 'card', card: { brand: card.brand, last4: card.last4 } },
    }
  }
  return charge
}

export function cardErrorFor(pi: PaymentIntent): ApiError {
  const e = pi.last_payment_error as PaymentError
  // observed SDK behaviour: a 402 becomes StripeCardError carrying code, decline_code and payment_intent
  return new ApiError(402, {
    type: 'card_error',
    code: e.code,
    ...(e.decline_code ? { decline_code: e.decline_code } : {}),
    message: e.message,
    ...(e.charge ? { charge: e.charge } : {}),
    payment_intent: clone(pi),
    ...(e.payment_method ? { payment_method: e.payment_method } : {}),
  })
}

