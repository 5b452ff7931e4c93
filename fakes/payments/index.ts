/**
 * Starts the local payment fake: `tsx fakes/payments/index.ts`.
 *
 * PAYMENTS_FAKE_PORT (default 12111), webhook URL NUXT_PUBLIC_ORIGIN + /api/webhooks/stripe
 * (default http://localhost:$PORT/api/webhooks/stripe, PORT 3000 when unset, as the server's), secret NUXT_STRIPE_WEBHOOK_SECRET
 * (default whsec_boreline_local_secret). Point the SDK at it with
 * `{ host: '127.0.0.1', port, protocol: 'http' }`.
 */
import { pathToFileURL } from 'node:url'
import { createPaymentsFake, type PaymentsFake } from './server'

export const DEFAULT_PAYMENTS_FAKE_PORT = 12111
export const DEFAULT_WEBHOOK_SECRET = 'whsec_boreline_local_secret'

/** Reads the environment, starts the fake on 127.0.0.1 and returns it with its URL. */
export async function startPaymentsFake(env: NodeJS.ProcessEnv = process.env): Promise<{ fake: PaymentsFake; port: number; url: string }> {
  const rawPort = env.PAYMENTS_FAKE_PORT ?? String(DEFAULT_PAYMENTS_FAKE_PORT)
  const port = Number(rawPort)
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`PAYMENTS_FAKE_PORT must be a port number (0-65535), got "${rawPort}".`)
  }
  // the webhooks go to the server the demo started: its origin, else its PORT on this machine
  const origin = (env.NUXT_PUBLIC_ORIGIN || `http://localhost:${env.PORT || 3000}`).replace(/\/+$/, '')
  const host = '127.0.0.1'
  const fake = createPaymentsFake({
    port,
    host,
    webhookUrl: `${origin}/api/webhooks/stripe`,
    webhookSecret: env.NUXT_STRIPE_WEBHOOK_SECRET || DEFAULT_WEBHOOK_SECRET,
  })
  const { port: actual, url } = await fake.listen()
  return { fake, port: actual, url }
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href
if (isMain) {
  startPaymentsFake()
    .then(({ fake, url }) => {
      console.log(`payments fake listening on ${url} (webhooks to ${fake.state.config.webhookUrl})`)
      const stop = (): void => { void fake.close().then(() => process.exit(0)) }
      process.once('SIGINT', stop)
      process.once('SIGTERM', stop)
    })
    .catch((e: unknown) => {
      console.error(`payments fake failed to start: ${e instanceof Error ? e.message : String(e)}`)
      process.exit(1)
    })
}
