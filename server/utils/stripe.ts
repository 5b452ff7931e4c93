/**
 * The one payment-service client: the official `stripe` SDK, pointed by runtime config (NUXT_STRIPE_HOST,
 * _PORT, _PROTOCOL) at the local fake in fakes/payments (or at the real service, with its own key).
 * The SDK retries network failures and 409/5xx answers itself (twice); every POST we make carries an
 * idempotency key derived from our own records, so a retry never charges or refunds twice.
 */
import Stripe from 'stripe'
import { DomainError } from '../services/errors'
import { securityEvent } from '../services/security-log'

let client: Stripe | undefined
let clientKey = ''

export function useStripe(): Stripe {
  const config = useRuntimeConfig()
  const key = `${config.stripeSecretKey}|${config.stripeHost}|${config.stripePort}|${config.stripeProtocol}`
  if (client && clientKey === key) return client
  client = new Stripe(String(config.stripeSecretKey), {
    host: String(config.stripeHost),
    port: Number(config.stripePort),
    protocol: String(config.stripeProtocol) === 'https' ? 'https' : 'http',
    telemetry: false,
    maxNetworkRetries: 2,
    timeout: 20_000,
  })
  clientKey = key
  return client
}

/**
 * A webhook event whose signature verifies against the raw body (re-serialising a parsed body would break it)
 * and the signing secret (`whsec_...`); a missing, bad or stale signature is 400 and nothing is done.
 */
export function verifiedStripeEvent(raw: string | Buffer | undefined, signature: string | undefined): Stripe.Event {
  if (!raw || !signature) {
    securityEvent('webhook.bad_signature', { path: '/api/webhooks/stripe', reason: 'no signature or body' })
    throw new DomainError('bad_request', 'A signed event body is required.')
  }
  try {
    return useStripe().webhooks.constructEvent(raw, signature, String(useRuntimeConfig().stripeWebhookSecret))
  } catch {
    securityEvent('webhook.bad_signature', { path: '/api/webhooks/stripe', reason: 'signature does not verify' })
    throw new DomainError('bad_request', 'The event signature does not verify.')
  }
}

/** A short, safe description of a payment-service failure for logs and the caller. */
export function stripeProblem(err: unknown): string {
  if (err instanceof Stripe.errors.StripeError) return `${err.type}${err.code ? ` (${err.code})` : ''}: ${err.message}`
  return err instanceof Error ? err.message : String(err)
}
