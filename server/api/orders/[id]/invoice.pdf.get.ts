/**
 * GET /api/orders/:id/invoice.pdf -> the order confirmation (application/pdf, as an attachment): what was paid or
 * put on account, line by line. The numbered VAT invoices come with each dispatch (GET /api/documents).
 * Garage managers for their own orders; distributor staff (`orders.work`) for any. 401; 403; 404 (not theirs);
 * 409 while the order is not yet paid or on account.
 */
import { OrderParamsSchema } from '#shared/schemas/orders'
import { can } from '#shared/utils/abilities'
import { orderReference } from '#shared/types/orders'
import { findVisibleOrder } from '../../../services/orders/find'
import { invoiceOf } from '../../../services/orders/invoice-pdf'

export default defineEventHandler(async (event) => {
  const auth = requireAuth(event)
  const staff = auth.org.kind === 'distributor' && can(auth.user.role, 'orders.work')
  if (!staff) requireAbility(event, 'orders.place')
  const { id } = paramsWith(event, OrderParamsSchema)
  const order = await findVisibleOrder(id, staff ? null : auth.org.id)
  const pdf = await invoiceOf(order, serverFormats(), await pdfFonts())
  return sendDownload(event, pdf, { name: `order-${orderReference(order.id)}.pdf`, type: 'application/pdf' })
})
