/**
 * PATCH /api/quotes/:id  { vehicleId?, registration?, odometer?, ownerName?, ownerEmail?, ownerPhone?, messageToOwner?, inspectionId? }
 * Changes a draft in place. A quote that has been sent (or decided, or has expired) is never changed: the change
 * goes into a new revision (same number, revision + 1), the old one is kept as superseded. -> QuoteDetail of the
 * quote that now holds the change (its `id` differs from the URL's when a revision was made).
 * 401; 422 with `data.fields`; 404 not this garage's quote; 403 without `quotes.draft`; 409 a replaced revision.
 */
import { QuoteUpdateSchema } from '#shared/schemas/quotes'
import { updateQuote } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, QuoteUpdateSchema)
  const { auth, quote } = await loadOwnQuote(event)
  return quoteAnswer(await updateQuote(quote, auth, body), auth)
})
