/**
 * Back-orders are filled the moment stock arrives through the counter (goods in, returns, cancellations), in the
 * same transaction. Stock can also arrive by other ways (a price file's stock counts); every couple of seconds
 * (BORELINE_BACK_ORDER_SECONDS, default 2; 0 turns it off) this looks at the stock revision the database bumps on
 * any stock change, and when it moved, fills what it can, oldest order first.
 */
import { databaseReady } from '../utils/ready'
import { serverFormats } from '../utils/format'
import { fillBackOrdersIfStockMoved } from '../services/orders/back-orders'

export default defineNitroPlugin((nitro) => {
  const seconds = Number(process.env.BORELINE_BACK_ORDER_SECONDS ?? 2)
  if (!Number.isFinite(seconds) || seconds <= 0) return
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    databaseReady()
      .then(() => fillBackOrdersIfStockMoved(serverFormats().timeZone))
      .then((n) => { if (n) console.info(`[boreline] back-orders filled: ${n} line(s)`) })
      .catch((err) => console.error('[boreline] back-order fill failed:', err?.message ?? err))
      .finally(() => { running = false })
  }, seconds * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
