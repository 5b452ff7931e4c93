/**
 * GET /api/basket -> { items: [{ sku, description, quantity }] }: the garage's basket, kept with its account.
 * 401; 403 without `orders.place`.
 */
import { basketOf } from '../services/orders/basket'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.place')
  return basketOf(org.id)
})
