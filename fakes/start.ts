/** npm run fakes: every local stand-in for a hosted service, in one process (Ctrl-C stops them). */
import { startPaymentsFake } from './payments/index'
import { startVehicleDataFake } from './vehicle-data/index'

await import('./mail/index')
const { url, fake } = await startPaymentsFake()
console.log(`payments fake: ${url} (webhooks to ${fake.state.config.webhookUrl})`)
const vehicleData = await startVehicleDataFake()
console.log(`vehicle-data fake: ${vehicleData.url}`)
