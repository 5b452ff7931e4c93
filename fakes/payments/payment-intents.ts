/**
 * `/v1/payment_intents` (create, retrieve, confirm, cancel, capture) and `/v1/charges/:id`. Intents made by a
 * Checkout Session belong to it: they are paid through its page and cannot be confirmed or canceled here.
 */
import { z } from 'zod'
import { cardOfPaymentMethod } from './cards'
import { cardErrorFor, chargeIntent, newIntent } from './charges'
import { route, type Fake, type RequestContext, type Route } from './context'
import { paramError, stateError } from './errors'
import { emit } from './events'
import { createEndpoint, retrieveEndpoint } from './endpoints'
import { expand } from './listing'
import { currencyCode, formatMoney, minimumAmount } from './money'
import { boolean, expandField, form, integer, metadata, parse } from './params'
import { chargeById, intentById, mergeMetadata } from './store'
import type { PaymentIntent } from './types'

const intentCreateSchema = form({
  amount: integer(1, 99999999),
  currency: z.string(),
  metadata: metadata.optional(),
  description: z.string().max(1000).optional(),
  payment_method: z.string().optional(),
  payment_method_types: z.array(z.enum(['card'])).optional(),
  automatic_payment_methods: form({ enabled: boolean, allow_redirects: z.enum(['always', 'never']).optional() }).optional(),
  confirm: boolean.optional(),
  capture_method: z.enum(['automatic', 'automatic_async', 'manual']).optional(),
  receipt_email: z.string().optional(),
  return_url: z.string().optional(),
  expand: expandField.optional(),
})

const intentConfirmSchema = form({
  payment_method: z.string().optional(),
  return_url: z.string().optional(),
  receipt_email: z.string().optional(),
  expand: expandField.optional(),
})

const intentCancelSchema = form({
  cancellation_reason: z.enum(['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned']).optional(),
  expand: expandField.optional(),
})

const intentCaptureSchema = form({
  amount_to_capture: integer(1).optional(),
  metadata: metadata.optional(),
  expand: expandField.optional(),
})

const CANCELLABLE = ['requires_payment_method', 'requires_capture', 'requires_confirmation', 'requires_action', 'processing']

/** Refuses an intent a Checkout Session manages (API reference, from memory). */
function refuseSessionIntent(fake: Fake, pi: PaymentIntent, action: string, hint = ''): void {
  const session = fake.state.sessionOfIntent.get(pi.id)
  if (session) throw stateError(`You cannot ${action} this PaymentIntent because it is managed by Checkout Session ${session}${hint}.`)
}

function confirmIntent(fake: Fake, pi: PaymentIntent, paymentMethod: string | undefined, ctx: RequestContext): void {
  refuseSessionIntent(fake, pi, 'confirm')
  if (pi.status !== 'requires_payment_method' && pi.status !== 'requires_confirmation') {
    throw stateError(`You cannot confirm this PaymentIntent because it has a status of ${pi.status}.`)
  }
  const pm = paymentMethod ?? pi.payment_method
  if (!pm) {
    throw stateError("You cannot confirm this PaymentIntent because it's missing a payment method. Specify `payment_method` when confirming.", 'payment_intent_unexpected_state', 'payment_method')
  }
  const card = cardOfPaymentMethod(pm)
  chargeIntent(fake, pi, card, pm)
  if (!card.ok) {
    emit(fake, 'payment_intent.payment_failed', pi, ctx)
    throw cardErrorFor(pi)
  }
  // chargeIntent has moved the status on since the check above
  emit(fake, (pi as PaymentIntent).status === 'succeeded' ? 'payment_intent.succeeded' : 'payment_intent.amount_capturable_updated', pi, ctx)
}

function createIntent(fake: Fake, p: z.output<typeof intentCreateSchema>, ctx: RequestContext): PaymentIntent {
  const currency = currencyCode(p.currency, 'currency')
  const minimum = minimumAmount(currency)
  if (p.amount < minimum) throw paramError(`Amount must be at least ${formatMoney(minimum, currency)} ${currency}`, 'amount', 'amount_too_small')
  if (p.payment_method) cardOfPaymentMethod(p.payment_method)
  const pi = newIntent(fake, {
    amount: p.amount,
    currency,
    metadata: mergeMetadata({}, p.metadata),
    description: p.description ?? null,
    ...(p.capture_method ? { captureMethod: p.capture_method } : {}),
    receiptEmail: p.receipt_email ?? null,
    ...(p.payment_method_types ? { paymentMethodTypes: p.payment_method_types } : {}),
  })
  if (p.payment_method) {
    pi.payment_method = p.payment_method
    pi.status = 'requires_confirmation'
  }
  if (p.confirm) confirmIntent(fake, pi, p.payment_method, ctx)
  return pi
}

export function paymentIntentRoutes(fake: Fake): Route[] {
  const { state } = fake
  return [
    createEndpoint(fake, /^\/v1\/payment_intents$/, intentCreateSchema, (p, ctx) => createIntent(fake, p, ctx)),

    retrieveEndpoint(fake, /^\/v1\/payment_intents\/([^/]+)$/, (id) => intentById(state, id)),

    route('POST', /^\/v1\/payment_intents\/([^/]+)\/confirm$/, (raw, [id], ctx) => {
      const p = parse(intentConfirmSchema, raw)
      const pi = intentById(state, id as string)
      confirmIntent(fake, pi, p.payment_method, ctx)
      return { body: expand(state, pi, p.expand) }
    }),

    route('POST', /^\/v1\/payment_intents\/([^/]+)\/cancel$/, (raw, [id], ctx) => {
      const p = parse(intentCancelSchema, raw)
      const pi = intentById(state, id as string)
      refuseSessionIntent(fake, pi, 'cancel', '; expire the session instead')
      if (!CANCELLABLE.includes(pi.status)) {
        // API reference (from memory)
        throw stateError(
          `You cannot cancel this PaymentIntent because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be canceled: ${CANCELLABLE.join(', ')}.`,
        )
      }
      pi.status = 'canceled'
      pi.canceled_at = fake.now()
      pi.cancellation_reason = p.cancellation_reason ?? null
      pi.amount_capturable = 0
      emit(fake, 'payment_intent.canceled', pi, ctx)
      return { body: expand(state, pi, p.expand) }
    }),

    route('POST', /^\/v1\/payment_intents\/([^/]+)\/capture$/, (raw, [id], ctx) => {
      const p = parse(intentCaptureSchema, raw)
      const pi = intentById(state, id as string)
      if (pi.status !== 'requires_capture') {
        // API reference (from memory)
        throw stateError(
          `This PaymentIntent could not be captured because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be captured: requires_capture.`,
        )
      }
      const amount = p.amount_to_capture ?? pi.amount_capturable
      if (amount > pi.amount_capturable) {
        throw paramError(`The amount to capture (${amount}) is greater than the amount capturable (${pi.amount_capturable}).`, 'amount_to_capture', 'amount_too_large')
      }
      const charge = chargeById(state, String(pi.latest_charge))
      charge.captured = true
      charge.amount_captured = amount
      pi.amount_received = amount
      pi.amount_capturable = 0
      pi.status = 'succeeded'
      pi.metadata = mergeMetadata(pi.metadata, p.metadata)
      emit(fake, 'payment_intent.succeeded', pi, ctx)
      return { body: expand(state, pi, p.expand) }
    }),

    retrieveEndpoint(fake, /^\/v1\/charges\/([^/]+)$/, (id) => chargeById(state, id)),
  ]
}
