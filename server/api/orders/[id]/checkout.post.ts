/**
 * POST /api/orders/:id/checkout -> { url, alreadyPaid }: where to send the browser to pay the order by card.
 * An open checkout is reused (after a declined card the garage retries on the same page); it expires after the
 * order's hold time (NUXT_ORDER_HOLD_MINUTES). A lapsed order is priced again first: 409 with `repriced`
 * { previousTotalMinor, totalMinor } when a price changed (pay again to go ahead), else it takes its stock again.
 * The payment-service call carries an idempotency key derived from the order.
 * 401; 403 without `orders.pay`; 404 not the caller's; 409 not payable / "Only N left…" / repriced; 502 payment
 * service down.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { holdMinutesOf } from '../../../services/orders/rules'
import { startCheckout } from '../../../services/payments/checkout'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'orders.pay')
  const { id } = paramsWith(event, OrderParamsSchema)
  const r = await startCheckout(org.id, id, user, serverFormats(), holdMinutesOf(useRuntimeConfig(event).orderHoldMinutes))
  return { url: r.url, alreadyPaid: r.alreadyPaid }
})
