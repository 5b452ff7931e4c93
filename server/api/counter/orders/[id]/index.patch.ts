/**
 * PATCH /api/counter/orders/:id { status: "picking" | "dispatched" | "delivered" | "cancelled", reason? }
 * Counter staff move an order along the queue: confirmed -> picking -> dispatched (delivery note e-mailed)
 * -> delivered; or cancel it before it leaves (card: refunded through the payment service; account: credited).
 * The garage is e-mailed at each step. -> OrderDetail. 401; 403 without `orders.work`; 404; 409 not a move
 * from the order's state; 422.
 */
import { CounterOrderPatchSchema, OrderParamsSchema } from '#shared/schemas/orders'
import { moveOrder } from '../../../../services/orders/moves'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'orders.work')
  const { id } = paramsWith(event, OrderParamsSchema)
  const { status, reason } = await bodyWith(event, CounterOrderPatchSchema)
  return moveOrder(id, { to: status, reason }, user, serverFormats(), await pdfFonts())
})
