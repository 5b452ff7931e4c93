/**
 * POST /api/quotes/:id/revisions  -> 201 QuoteDetail of a new draft revision of a quote that has left draft
 * (the old one is kept, superseded; its owner's link then says it was replaced).
 * 401; 404 not this garage's quote; 403 without `quotes.draft`; 409 for a draft or an already replaced revision.
 */
import { newRevision } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { auth, quote } = await loadOwnQuote(event)
  const revised = await newRevision(quote, auth)
  setResponseStatus(event, 201)
  return quoteAnswer(revised, auth)
})
