/**
 * POST /api/orders/:id/cancel { reason? } -> OrderDetail
 * The garage cancels its own order before picking starts: the stock goes back; an open checkout is closed;
 * a paid card order is refunded through the payment service, an account order credited.
 * 401; 403 not a garage manager; 404 not the caller's; 409 picking has started (ask the counter) or already closed.
 */
import { OrderCancelSchema, OrderParamsSchema } from '#shared/schemas/orders'
import { findGarageOrder, garageMayCancel, orderDetail } from '../../../services/orders'
import { cancelOrder, runAfter, type After } from '../../../services/payments'
import { withWrite } from '../../../utils/db'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'orders.place')
  const { id } = paramsWith(event, OrderParamsSchema)
  const { reason } = await bodyWith(event, OrderCancelSchema)
  const after: After = []
  await withWrite(async (t) => {
    const order = await findGarageOrder(org.id, id, t)
    if (!garageMayCancel(order)) {
      throw conflict(order.status === 'cancelled'
        ? 'This order is already cancelled.'
        : 'Picking has started, so the order can no longer be cancelled here. Please call the branch.')
    }
    after.push(...await cancelOrder(t, order, user, reason))
  })
  await runAfter(after)
  return orderDetail(await findGarageOrder(org.id, id), 'garage')
})
