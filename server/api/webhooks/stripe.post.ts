/**
 * POST /api/webhooks/stripe: events from the payment service (machine to machine; exempt from the cross-site
 * check in server/middleware/10.session.ts, authenticated by its signature instead).
 * The signature is checked on the raw body: a bad or stale signature is 400 and changes nothing. A verified
 * event is handled once (its id is recorded in the same transaction as its effects); duplicates and unknown
 * types get 200. -> { received, duplicate, outcome }
 */
import { handleStripeEvent } from '../../services/payments/events'

export default defineEventHandler(async (event) => {
  const raw = await readRawBody(event, false)
  const evt = verifiedStripeEvent(raw, getRequestHeader(event, 'stripe-signature'))
  const result = await handleStripeEvent(evt, serverFormats())
  return { received: true, duplicate: result.duplicate, outcome: result.outcome }
})
