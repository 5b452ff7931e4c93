/**
 * GET /api/counter/orders/:id/delivery-note.pdf -> the delivery note (no prices) for picking and the driver.
 * 401; 403 without `orders.work`; 404; 409 before the order is confirmed.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { orderReference } from '#shared/types/orders'
import { findAnyOrder } from '../../../../services/orders/find'
import { deliveryNoteOf } from '../../../../services/orders/delivery-note-pdf'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'orders.work')
  const { id } = paramsWith(event, OrderParamsSchema)
  const order = await findAnyOrder(id)
  const pdf = await deliveryNoteOf(order, serverFormats(), await pdfFonts())
  return sendDownload(event, pdf, { name: `delivery-note-${orderReference(order.id)}.pdf`, type: 'application/pdf' })
})
