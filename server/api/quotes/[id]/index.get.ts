/**
 * GET /api/quotes/:id  -> QuoteDetail with `lines` and `totals: { netMinor, taxMinor, grossMinor }`
 * (plus the approved totals after the owner's decision, stock per part line and the revision history).
 * Trade prices and markups are null for technicians unless their garage lets them see prices.
 * 401 signed out; 404 not this garage's quote; 403 without `quotes.draft`.
 */
import { expireDueQuotes } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { auth, quote } = await loadOwnQuote(event)
  if (await expireDueQuotes({ id: quote.id })) await quote.reload()
  return quoteAnswer(quote, auth)
})
