/**
 * The payments fake sends its webhooks to the server the demo started: NUXT_PUBLIC_ORIGIN when set, else the
 * server's PORT on this machine (3000 when unset), so `PORT=4000 npm run demo` still sees its card payments land.
 */
import { afterEach, describe, expect, it } from 'vitest'
import { startPaymentsFake } from '../../../fakes/payments/index'

const started: { close: () => Promise<void> }[] = []
afterEach(async () => { for (const f of started.splice(0)) await f.close() })

async function webhookUrlWith(env: NodeJS.ProcessEnv): Promise<string | null> {
  const { fake } = await startPaymentsFake({ PAYMENTS_FAKE_PORT: '0', ...env })
  started.push(fake)
  return fake.state.config.webhookUrl
}

describe('payments fake webhook URL', () => {
  it('follows PORT when no origin is set', async () => {
    expect(await webhookUrlWith({ PORT: '4123' })).toBe('http://localhost:4123/api/webhooks/stripe')
  })
  it('defaults to port 3000, like the server', async () => {
    expect(await webhookUrlWith({})).toBe('http://localhost:3000/api/webhooks/stripe')
  })
  it('takes the public origin when there is one', async () => {
    expect(await webhookUrlWith({ PORT: '4123', NUXT_PUBLIC_ORIGIN: 'https://boreline.example/' })).toBe('https://boreline.example/api/webhooks/stripe')
  })
})
