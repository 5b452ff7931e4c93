/**
 * POST /api/orders/preview  (the body of POST /api/orders; `payment` optional)
 * What the order would be, changing nothing: lines re-priced at the garage's current net price with the
 * differences against the quote, stock at the branch, the branches, and the trade-account headroom.
 * -> OrderPreview. 401; 403 not a garage manager; 404 quote not the caller's; 409 quote not orderable; 422.
 */
import { OrderPreviewSchema } from '#shared/schemas/orders'
import { previewOrder } from '../../services/orders/preview'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.place')
  const input = await bodyWith(event, OrderPreviewSchema)
  return previewOrder(org.id, input, serverFormats())
})
