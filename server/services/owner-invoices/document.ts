/** The owner invoice's PDF with its garage and car, and its file name. */
import type { Quote } from '../../models/quotes'
import type { OwnerInvoice } from '../../models/jobs'
import { garageLetterhead, type QuoteOutput } from '../quotes/document'
import { quoteReference } from '../quotes/references'
import { renderOwnerInvoicePdf } from './pdf'
import { ownerInvoiceView } from './view'

export async function ownerInvoicePdf(inv: OwnerInvoice, q: Quote, out: QuoteOutput): Promise<Buffer> {
  const [head, fonts] = await Promise.all([garageLetterhead(inv.organisationId, out.uploadsDir), out.fonts()])
  const car = { vehicle: q.vehicleLabel, registration: q.registration ?? '', odometer: q.odometer ?? '', quoteReference: quoteReference(q) }
  return renderOwnerInvoicePdf(ownerInvoiceView(inv), car, head.garage, head.logo, fonts, out.formats)
}

export function ownerInvoicePdfName(inv: Pick<OwnerInvoice, 'number'>): string {
  return `invoice-${String(inv.number).padStart(5, '0')}.pdf`
}
