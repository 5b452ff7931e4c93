/**
 * GET /api/quotes/:id/job-card.pdf -> application/pdf: the job card for the ramp (shown in the browser).
 * 401; 404 not this garage's quote; 403 without `jobs.work`; 409 not approved by the owner.
 */
import { jobCardPdf } from '../../../services/jobs/job-card-document'

export default defineEventHandler(async (event) => {
  const { quote } = await loadOwnQuote(event, 'jobs.work')
  const pdf = await jobCardPdf(quote, quoteOutput(event))
  return sendDownload(event, pdf, { name: `job-card-${quote.number}.pdf`, type: 'application/pdf', inline: true })
})
