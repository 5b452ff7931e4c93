/**
 * POST /api/orders/:id/checkout -> { url, alreadyPaid }: where to send the browser to pay the order by card.
 * An open checkout is reused (after a declined card the garage retries on the same page); a lapsed order
 * takes its stock again first. The payment-service call carries an idempotency key derived from the order.
 * 401; 403 without `orders.pay`; 404 not the caller's; 409 not payable / "Only N left…"; 502 payment service down.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { startCheckout } from '../../../services/payments/checkout'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'orders.pay')
  const { id } = paramsWith(event, OrderParamsSchema)
  const r = await startCheckout(org.id, id, user, serverFormats())
  return { url: r.url, alreadyPaid: r.alreadyPaid }
})
