/**
 * POST /api/orders/preview  (the body of POST /api/orders; `payment` optional)
 * What the order would be, changing nothing: lines re-priced at the garage's current net price with the
 * differences against the quote; each requested line supplied from the branch's shelf as far as it goes, the
 * rest by transfer or back-order, every piece a line `{ sku, quantity, source: "home" | "transfer" | "back_order"
 * | "collect", branch, arrivesAt, promise }`; the branches and the trade-account headroom.
 * -> OrderPreview. 401; 403 not a garage manager; 404 quote not the caller's; 409 quote not orderable; 422.
 */
import { OrderPreviewSchema } from '#shared/schemas/orders'
import { previewOrder } from '../../services/orders/preview'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.place')
  const input = await bodyWith(event, OrderPreviewSchema)
  return previewOrder(org.id, input, serverFormats(), requestNow(event))
})
