/**
 * GET /api/quote-links/:token  -> OwnerQuoteView (no sign-in: the token is the owner's key)
 * The owner's view of one quote: the garage's name and contact, the vehicle, the findings in plain words, the
 * lines with what may be declined, the totals; after the decision, the decision (read-only). Nothing else of the
 * garage is reachable. A replaced revision answers `state: "superseded"`.
 * 404 "This link is not valid" for a wrong or expired token; 429 when one address tries too often.
 */
import { ownerView } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { quote } = await loadLinkedQuote(event)
  return ownerView(quote, serverFormats().currency)
})
