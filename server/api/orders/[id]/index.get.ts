/**
 * GET /api/orders/:id -> OrderDetail (lines with their supply, state and promise; totals, payment state, last
 * decline, dispatches with their invoices, core returns, timeline).
 * 401; 403 not a garage manager; 404 not found or another garage's.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { findGarageOrder } from '../../../services/orders/find'
import { orderDetail } from '../../../services/orders/views'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.place')
  const { id } = paramsWith(event, OrderParamsSchema)
  return orderDetail(await findGarageOrder(org.id, id), 'garage', requestClock(event))
})
