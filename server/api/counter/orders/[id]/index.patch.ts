/**
 * PATCH /api/counter/orders/:id { status: "picking" | "dispatched" | "delivered" | "cancelled", reason? }
 * Counter staff move an order along the queue: confirmed -> picking -> dispatched (delivery note e-mailed)
 * -> delivered; or cancel it before it leaves (card: refunded through the payment service; account: credited).
 * The garage is e-mailed at each step. -> OrderDetail. 401; 403 without `orders.work`; 404; 409 not a move
 * from the order's state; 422.
 */
import { CounterOrderPatchSchema, OrderParamsSchema } from '#shared/schemas/orders'
import { findAnyOrder, orderDetail } from '../../../../services/orders'
import { moveOrder } from '../../../../services/payments'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'orders.work')
  const { id } = paramsWith(event, OrderParamsSchema)
  const { status, reason } = await bodyWith(event, CounterOrderPatchSchema)
  await moveOrder(id, status, user, reason)
  return orderDetail(await findAnyOrder(id), 'counter')
})
