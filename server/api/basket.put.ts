/**
 * PUT /api/basket { items: [{ sku, description?, quantity }] } -> { items }: replaces the garage's basket (the same
 * part twice becomes one line). A quantity that is 0, negative, fractional or over 999 is a 422 naming
 * `items.N.quantity`, and the basket stays as it was. 401; 403 without `orders.place`.
 */
import { BasketSchema } from '#shared/schemas/orders'
import { saveBasket } from '../services/orders/basket'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.place')
  const input = await bodyWith(event, BasketSchema)
  return saveBasket(org.id, input)
})
