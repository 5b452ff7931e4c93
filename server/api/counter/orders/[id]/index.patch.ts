/**
 * PATCH /api/counter/orders/:id { status: "picking" | "dispatched" | "delivered" | "cancelled", reason? }
 * Counter staff move an order along the queue: confirmed -> picking -> dispatched -> delivered. "dispatched" sends
 * what is picked (POST …/picks; without picks recorded, every line ready to go, in full), issues its invoice and
 * e-mails the delivery note; while lines are still to come the order stands as part_dispatched and goes back to
 * picking when they are ready. "cancelled" cancels what has not left (card: refunded through the payment service;
 * account: credited). -> OrderDetail. 401; 403 without `orders.work`; 404; 409 not a move from the order's state,
 * or nothing ready to send; 422.
 */
import { CounterOrderPatchSchema, OrderParamsSchema } from '#shared/schemas/orders'
import { moveOrder } from '../../../../services/orders/moves'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'orders.work')
  const { id } = paramsWith(event, OrderParamsSchema)
  const { status, reason } = await bodyWith(event, CounterOrderPatchSchema)
  return moveOrder(id, { to: status, reason }, user, serverFormats(), await pdfFonts(), requestClock(event))
})
