/**
 * POST /api/counter/orders/:id/picks { lines: [{ lineId, picked, shortfall?: "back_order" | "transfer" }] } -> OrderDetail
 * What the counter found on the shelf for lines ready to pick; a short line names where the rest comes from (a
 * back-order from the supplier, or a transfer from the branch with enough) and becomes its own line, and the garage
 * is told. The order must be being picked. 401; 403 without `orders.work`; 404; 409 not being picked; 422 a line
 * not on the order or not ready, more than the line, a short line without its shortfall, no branch to transfer from.
 */
import { CounterPickSchema, OrderParamsSchema } from '#shared/schemas/orders'
import { recordPicks } from '../../../../services/orders/picks'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'orders.work')
  const { id } = paramsWith(event, OrderParamsSchema)
  const input = await bodyWith(event, CounterPickSchema)
  return recordPicks(id, input, user, requestClock(event))
})
