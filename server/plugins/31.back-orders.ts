/**
 * Back-orders are filled the moment stock arrives through the counter (goods in, returns, cancellations), in the
 * same transaction. Stock can also arrive by other ways (a price file's stock counts); every couple of seconds
 * (BORELINE_BACK_ORDER_SECONDS, default 2; 0 turns it off) this looks at the stock revision the database bumps on
 * any stock change, and when it moved, fills what it can, oldest order first.
 */
import { serverFormats } from '../utils/format'
import { everyFewSeconds } from '../utils/interval-job'
import { fillBackOrdersIfStockMoved } from '../services/orders/back-orders'

export default defineNitroPlugin((nitro) => {
  everyFewSeconds(nitro, {
    setting: 'BORELINE_BACK_ORDER_SECONDS', defaultSeconds: 2, name: 'back-order fill',
    run: () => fillBackOrdersIfStockMoved(serverFormats().timeZone),
    report: (n) => { if (n) console.info(`[boreline] back-orders filled: ${n} line(s)`) },
  })
})
