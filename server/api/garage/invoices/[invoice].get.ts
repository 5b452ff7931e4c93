/**
 * GET /api/garage/invoices/:id -> OwnerInvoiceView;  GET /api/garage/invoices/:id.pdf -> application/pdf.
 * The garage's own invoice to an owner (one file answers both: the router cannot split ":id.pdf" from ":id").
 * 401; 422 not an invoice number; 404 not this garage's invoice; 403 without `jobs.invoice`.
 */
import { OwnerInvoiceParamsSchema } from '#shared/schemas/jobs'
import { findOwnerInvoice, ownerInvoicePdf, ownerInvoicePdfName, ownerInvoiceView } from '../../../services/owner-invoices'
import { findQuoteOf } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAuth(event)
  const { invoice } = paramsWith(event, OwnerInvoiceParamsSchema)
  const inv = await findOwnerInvoice(org.id, Number.parseInt(invoice, 10))
  if (!inv) throw notFound('Invoice')
  if (!can(user.role, 'jobs.invoice')) throw forbidden()
  if (!invoice.endsWith('.pdf')) return ownerInvoiceView(inv)
  const quote = await findQuoteOf(org.id, inv.quoteId)
  if (!quote) throw notFound('Invoice')
  return sendDownload(event, await ownerInvoicePdf(inv, quote, quoteOutput(event)), { name: ownerInvoicePdfName(inv), type: 'application/pdf', inline: true })
})
