/**
 * GET /api/counter/orders/:id -> OrderDetail with the garage, the moves allowed from here and the pick list (by bin,
 * with what each line waits for).
 * 401; 403 without `orders.work`; 404.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { findAnyOrder } from '../../../../services/orders/find'
import { orderDetail } from '../../../../services/orders/views'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'orders.work')
  const { id } = paramsWith(event, OrderParamsSchema)
  return orderDetail(await findAnyOrder(id), 'counter', requestClock(event))
})
