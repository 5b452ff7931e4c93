/** The job card's PDF with the garage's letterhead. */
import type { Quote } from '../../models/quotes'
import { garageLetterhead, type QuoteOutput } from '../quotes/document'
import { jobCardOf } from './job-card'
import { renderJobCardPdf } from './job-card-pdf'

export async function jobCardPdf(q: Quote, out: QuoteOutput): Promise<Buffer> {
  const [card, head, fonts] = await Promise.all([jobCardOf(q), garageLetterhead(q.organisationId, out.uploadsDir), out.fonts()])
  return renderJobCardPdf(card, head.garage, head.logo, fonts, out.formats)
}
