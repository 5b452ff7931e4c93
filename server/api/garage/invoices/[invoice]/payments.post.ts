/**
 * POST /api/garage/invoices/:id/payments  { method: "cash" | "card" | "transfer", amountMinor, reference? }
 * Records money the owner paid at the desk (no card service). -> 201 OwnerInvoiceView.
 * 401; 422 with `data.fields` (more than is due); 404 not this garage's invoice; 403 without `jobs.invoice`.
 */
import { OwnerInvoiceParamsSchema, OwnerPaymentSchema } from '#shared/schemas/jobs'
import { findOwnerInvoice, ownerInvoiceView, recordOwnerPayment } from '../../../../services/owner-invoices'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAuth(event)
  const { invoice } = paramsWith(event, OwnerInvoiceParamsSchema)
  const body = await bodyWith(event, OwnerPaymentSchema)
  const inv = await findOwnerInvoice(org.id, Number.parseInt(invoice, 10))
  if (!inv) throw notFound('Invoice')
  if (!can(user.role, 'jobs.invoice')) throw forbidden()
  await recordOwnerPayment(inv, user.id, body)
  setResponseStatus(event, 201)
  return ownerInvoiceView((await findOwnerInvoice(org.id, inv.id))!)
})
