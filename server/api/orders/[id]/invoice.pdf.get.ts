/**
 * GET /api/orders/:id/invoice.pdf -> the order's invoice (application/pdf, as an attachment).
 * Garage managers for their own orders; distributor staff (`orders.work`) for any. 401; 403; 404 (not theirs);
 * 409 while the order is not yet paid or on account.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { Order } from '../../../models/orders'
import { hasInvoice } from '../../../services/orders'
import { invoicePdf } from '../../../services/order-pdf'
import { can } from '#shared/utils/abilities'
import { orderReference } from '#shared/types/orders'

export default defineEventHandler(async (event) => {
  const auth = requireAuth(event)
  const staff = auth.org.kind === 'distributor' && can(auth.user.role, 'orders.work')
  if (!staff) requireAbility(event, 'orders.place')
  const { id } = paramsWith(event, OrderParamsSchema)
  const order = await Order.findOne({ where: staff ? { id } : { id, organisationId: auth.org.id } })
  if (!order) throw notFound('Order')
  if (!hasInvoice(order)) throw conflict('The invoice is issued once the order is paid or put on the account.')
  const pdf = await invoicePdf(order.id)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="invoice-${orderReference(order.id)}.pdf"`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
  })
  return pdf
})
