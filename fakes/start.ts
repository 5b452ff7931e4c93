/** npm run fakes: every local stand-in for a hosted service, in one process (Ctrl-C stops them). */
import { startPaymentsFake } from './payments/index'

await import('./mail/index')
const { url, fake } = await startPaymentsFake()
console.log(`payments fake: ${url} (webhooks to ${fake.state.config.webhookUrl})`)
