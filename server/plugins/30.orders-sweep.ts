/**
 * Every few minutes (BORELINE_ORDER_SWEEP_SECONDS, default 300; 0 turns it off), reconcile card orders with
 * the payment service: checkouts that completed or expired without their webhook reaching us, card orders
 * never taken to checkout (their stock goes back), refunds still to send. Counter staff can run the same at
 * once with POST /api/counter/orders/sweep.
 */
import { serverFormats } from '../utils/format'
import { everyFewSeconds } from '../utils/interval-job'
import { sweepOrders } from '../services/payments/sweep'
import { holdMinutesOf } from '../services/orders/rules'

export default defineNitroPlugin((nitro) => {
  everyFewSeconds(nitro, {
    setting: 'BORELINE_ORDER_SWEEP_SECONDS', defaultSeconds: 300, name: 'order sweep',
    run: () => sweepOrders(serverFormats(), holdMinutesOf(useRuntimeConfig().orderHoldMinutes)),
    report: (r) => { if (r.paid || r.lapsed || r.refunds || r.coreRefunds || r.errors) console.info('[boreline] order sweep:', JSON.stringify(r)) },
  })
})
