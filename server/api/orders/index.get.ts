/**
 * GET /api/orders?status=&page=&pageSize= -> Page<OrderSummary> ({ data, meta: { page, pageSize, total, pages } })
 * The caller's garage's orders, newest first. 401; 403 not a garage manager; 422 bad query.
 */
import { OrderListQuerySchema } from '#shared/schemas/orders'
import { garageOrders } from '../../services/orders/lists'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.place')
  const query = queryWith(event, OrderListQuerySchema)
  return garageOrders(org.id, query)
})
