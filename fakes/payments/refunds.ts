/**
 * `/v1/refunds`: create (by payment intent or charge, whole or in part, never more than was captured and not
 * yet refunded), list, retrieve. Each refund sends `refund.created` and `charge.refunded`.
 */
import { z } from 'zod'
import { route, type Fake, type RequestContext, type Route } from './context'
import { noSuch, paramError, stateError } from './errors'
import { emit } from './events'
import { createEndpoint, retrieveEndpoint } from './endpoints'
import { list, newestFirst } from './listing'
import { formatMoney } from './money'
import { expandField, form, integer, listFields, metadata, parse } from './params'
import { intentById, mergeMetadata, randomId, type FakeState } from './store'
import type { Charge, PaymentIntent, Refund } from './types'

const refundCreateSchema = form({
  payment_intent: z.string().optional(),
  charge: z.string().optional(),
  amount: integer(1).optional(),
  reason: z.enum(['duplicate', 'fraudulent', 'requested_by_customer']).optional(),
  metadata: metadata.optional(),
  expand: expandField.optional(),
})

const refundListSchema = form({
  ...listFields,
  payment_intent: z.string().optional(),
  charge: z.string().optional(),
})

type RefundParams = z.output<typeof refundCreateSchema>

/** The captured charge a refund request points at, and its intent. */
function refundable(state: FakeState, params: RefundParams): { charge: Charge; pi: PaymentIntent } {
  if (params.payment_intent) {
    const pi = state.paymentIntents.get(params.payment_intent)
    if (!pi) throw noSuch('payment_intent', params.payment_intent, 'payment_intent')
    const charge = typeof pi.latest_charge === 'string' ? state.charges.get(pi.latest_charge) : undefined
    if (!charge || charge.status !== 'succeeded' || !charge.captured) {
      throw stateError(`This PaymentIntent (${pi.id}) does not have a successful charge to refund.`, 'charge_not_refundable', 'payment_intent')
    }
    if (params.charge && params.charge !== charge.id) throw paramError(`Charge ${params.charge} does not belong to PaymentIntent ${pi.id}.`, 'charge')
    return { charge, pi }
  }
  if (!params.charge) {
    // API reference (from memory)
    throw paramError('One of the following params should be provided for this request: payment_intent or charge.', 'payment_intent', 'parameter_missing')
  }
  const charge = state.charges.get(params.charge)
  if (!charge) throw noSuch('charge', params.charge, 'charge')
  const pi = intentById(state, String(charge.payment_intent))
  if (charge.status !== 'succeeded' || !charge.captured) {
    throw stateError(`Charge ${charge.id} has not been captured and cannot be refunded.`, 'charge_not_refundable', 'charge')
  }
  return { charge, pi }
}

function refund(fake: Fake, params: RefundParams, ctx: RequestContext): Refund {
  const { charge, pi } = refundable(fake.state, params)
  const remaining = charge.amount_captured - charge.amount_refunded
  // API reference (from memory): code charge_already_refunded
  if (remaining <= 0) throw stateError(`Charge ${charge.id} has already been refunded.`, 'charge_already_refunded')
  const amount = params.amount ?? remaining
  if (amount > remaining) {
    // API reference (from memory): the amount may not exceed what was captured minus what was refunded
    throw stateError(
      `Refund amount (${formatMoney(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatMoney(remaining, charge.currency)})`,
      'amount_too_large',
      'amount',
    )
  }
  const r: Refund = {
    id: randomId('re_'),
    object: 'refund',
    amount,
    charge: charge.id,
    created: fake.now(),
    currency: charge.currency,
    metadata: mergeMetadata({}, params.metadata),
    payment_intent: pi.id,
    reason: params.reason ?? null,
    status: 'succeeded',
  }
  fake.state.refunds.set(r.id, r)
  const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded }
  charge.amount_refunded += amount
  charge.refunded = charge.amount_refunded >= charge.amount_captured
  emit(fake, 'refund.created', r, ctx)
  emit(fake, 'charge.refunded', charge, ctx, previous)
  return r
}

export function refundRoutes(fake: Fake): Route[] {
  const { state } = fake
  return [
    createEndpoint(fake, /^\/v1\/refunds$/, refundCreateSchema, (p, ctx) => refund(fake, p, ctx)),

    route('GET', /^\/v1\/refunds$/, (raw) => {
      const p = parse(refundListSchema, raw)
      let rows = newestFirst(state.refunds.values())
      if (p.payment_intent) rows = rows.filter((r) => r.payment_intent === p.payment_intent)
      if (p.charge) rows = rows.filter((r) => r.charge === p.charge)
      return { body: list(state, rows, p, '/v1/refunds') }
    }),

    retrieveEndpoint(fake, /^\/v1\/refunds\/([^/]+)$/, (id) => {
      const r = state.refunds.get(id)
      if (!r) throw noSuch('refund', id, 'refund')
      return r
    }),
  ]
}
