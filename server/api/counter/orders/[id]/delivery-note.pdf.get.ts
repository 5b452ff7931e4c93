/**
 * GET /api/counter/orders/:id/delivery-note.pdf -> the delivery note (no prices) for picking and the driver.
 * 401; 403 without `orders.work`; 404; 409 before the order is confirmed.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { Order } from '../../../../models/orders'
import { deliveryNotePdf } from '../../../../services/order-pdf'
import { orderReference } from '#shared/types/orders'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'orders.work')
  const { id } = paramsWith(event, OrderParamsSchema)
  const order = await Order.findByPk(id)
  if (!order) throw notFound('Order')
  if (!['confirmed', 'picking', 'dispatched', 'delivered'].includes(order.status)) throw conflict('There is no delivery note for an order that is not confirmed.')
  const pdf = await deliveryNotePdf(order.id)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="delivery-note-${orderReference(order.id)}.pdf"`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
  })
  return pdf
})
