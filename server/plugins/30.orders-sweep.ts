/**
 * Every few minutes (BORELINE_ORDER_SWEEP_SECONDS, default 300; 0 turns it off), reconcile card orders with
 * the payment service: checkouts that completed or expired without their webhook reaching us, card orders
 * never taken to checkout (their stock goes back), refunds still to send. Counter staff can run the same at
 * once with POST /api/counter/orders/sweep.
 */
import { databaseReady } from '../utils/ready'
import { serverFormats } from '../utils/format'
import { sweepOrders } from '../services/payments/sweep'
import { holdMinutesOf } from '../services/orders/rules'

export default defineNitroPlugin((nitro) => {
  const seconds = Number(process.env.BORELINE_ORDER_SWEEP_SECONDS ?? 300)
  if (!Number.isFinite(seconds) || seconds <= 0) return
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    databaseReady()
      .then(() => sweepOrders(serverFormats(), holdMinutesOf(useRuntimeConfig().orderHoldMinutes)))
      .then((r) => {
        if (r.paid || r.lapsed || r.refunds || r.coreRefunds || r.errors) console.info('[boreline] order sweep:', JSON.stringify(r))
      })
      .catch((err) => console.error('[boreline] order sweep failed:', err?.message ?? err))
      .finally(() => { running = false })
  }, seconds * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
