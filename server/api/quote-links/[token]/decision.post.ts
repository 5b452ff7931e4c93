/**
 * POST /api/quote-links/:token/decision
 *   { lines: [{ id, approved, acknowledgement?: { understood: true, signedName } }], signedName }
 * The owner approves or declines every line offered (parts, labour, sundries; a core deposit follows its part,
 * discounts apply to what is approved) and signs with their name. Nothing else can be sent: prices and lines
 * are the garage's (unknown fields are refused, lines not offered on this quote are refused). Declining a line
 * marked required takes a signed acknowledgement of the statement the page showed for it (422 on
 * `lines.N.acknowledgement` without one; an acknowledgement on any other choice is refused too).
 * Stored with the time and the IP address (the acknowledgement with the statement, name, time, address and
 * browser); the garage is e-mailed at once; the link then shows the decision read-only.
 * -> OwnerQuoteView. 404 "This link is not valid"; 422 with `data.fields`; 409 already decided or replaced, or the
 * garage's trade account is suspended (the owner is told to contact the garage); 429.
 */
import { QuoteDecisionSchema } from '#shared/schemas/quotes'
import { decideQuote, ownerView } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { quote, address } = await loadLinkedQuote(event)
  const body = await bodyWith(event, QuoteDecisionSchema)
  await refuseWhileGarageSuspended(quote)
  const origin = { address, userAgent: getRequestHeader(event, 'user-agent') ?? '' }
  const decided = await decideQuote(quote.id, body, origin, quoteOutput(event))
  return ownerView(decided, serverFormats().currency)
})
