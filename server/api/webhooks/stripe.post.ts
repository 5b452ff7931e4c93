/**
 * POST /api/webhooks/stripe: events from the payment service (machine to machine; exempt from the cross-site
 * check in server/middleware/10.session.ts, authenticated by its signature instead).
 * The signature is checked on the raw body with `stripe.webhooks.constructEvent` (re-serialising a parsed
 * body would break it): a bad or stale signature is 400 and changes nothing. A verified event is handled
 * once (its id is recorded in the same transaction as its effects); duplicates and unknown types get 200.
 */
import type Stripe from 'stripe'
import { handleStripeEvent } from '../../services/payments'

export default defineEventHandler(async (event) => {
  const raw = await readRawBody(event, false)
  const signature = getRequestHeader(event, 'stripe-signature')
  if (!raw || !signature) {
    throw new DomainError('bad_request', 'A signed event body is required.')
  }
  let evt: Stripe.Event
  try {
    evt = useStripe().webhooks.constructEvent(raw, signature, stripeWebhookSecret())
  } catch {
    throw new DomainError('bad_request', 'The event signature does not verify.')
  }
  const result = await handleStripeEvent(evt)
  return { received: true, duplicate: result.duplicate, outcome: result.outcome }
})
