/**
 * POST /api/quotes/:id/invoice -> 201 OwnerInvoiceView: the garage's invoice to the owner for the approved work,
 * numbered from the garage's own series, e-mailed to the owner with its PDF (`mailed` says whether it went).
 * 401; 404 not this garage's quote; 403 without `jobs.invoice` (managers); 409 not approved, not signed off, or
 * invoiced already (`data.invoiceId`).
 */
import { issueOwnerInvoice, ownerInvoiceView } from '../../../services/owner-invoices'

export default defineEventHandler(async (event) => {
  const { auth, quote } = await loadOwnQuote(event, 'jobs.invoice')
  const invoice = await issueOwnerInvoice(quote, auth.user.id, quoteOutput(event))
  setResponseStatus(event, 201)
  return ownerInvoiceView(invoice)
})
