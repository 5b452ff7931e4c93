/**
 * DELETE /api/quotes/:id/lines/:lineId  -> QuoteDetail
 * Removes a line (a part takes its core deposit with it; a core deposit alone cannot go: remove its part or mark
 * it absorbed). On a quote that has left draft the removal happens in a new revision.
 * 401; 404 not this garage's quote or line; 403 without `quotes.draft`; 409 a core deposit or a replaced revision.
 */
import { QuoteLineParamsSchema } from '#shared/schemas/quotes'
import { removeQuoteLine } from '../../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const { lineId } = paramsWith(event, QuoteLineParamsSchema)
  const { auth, quote } = await loadOwnQuote(event)
  return quoteAnswer(await removeQuoteLine(quote, auth, lineId), auth)
})
