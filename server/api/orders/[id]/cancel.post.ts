/**
 * POST /api/orders/:id/cancel { reason? } -> OrderDetail
 * The garage cancels its own order before picking starts: the stock goes back; an open checkout is closed;
 * a paid card order is refunded through the payment service, an account order credited.
 * 401; 403 not a garage manager; 404 not the caller's; 409 picking has started (ask the counter) or already closed.
 */
import { OrderCancelSchema, OrderParamsSchema } from '#shared/schemas/orders'
import { cancelGarageOrder } from '../../../services/orders/cancel'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'orders.place')
  const { id } = paramsWith(event, OrderParamsSchema)
  const { reason } = await bodyWith(event, OrderCancelSchema)
  return cancelGarageOrder(org.id, id, user, reason, serverFormats(), requestClock(event))
})
