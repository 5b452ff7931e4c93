/**
 * PATCH /api/quotes/:id/lines/:lineId
 *   { quantity?, description?, hours?, recommendation?, amountMinor?, unitPriceMinor?, markupBp?, rateMinor?,
 *     taxBp?, taxIncluded?, coreCharge?: "charged" | "absorbed", toldOwnerDeclinedRequired?, position? }
 * Technicians change quantities, hours, descriptions and recommendations; prices, markups, rates, tax rates,
 * whether a price includes tax (`taxIncluded`: a price in the same change is read that way, otherwise the price is
 * restated so it stays the same) and who carries a core deposit (absorbed by the garage, or charged to the owner)
 * are managers'; so is recording that the owner was talked through what declining a required line means. A
 * field that does not apply to the line's kind is refused (422; a core deposit's tax rate is fixed at 0). On a
 * quote that has left draft the change goes into a new revision (the line there has a new id), except that record
 * alone on a quote still with the owner: it changes no price or line.
 * -> QuoteDetail.
 * 401; 422; 404 not this garage's quote or line; 403; 409 a replaced revision.
 */
import { QuoteLineParamsSchema, QuoteLineUpdateSchema } from '#shared/schemas/quotes'
import { changeQuoteLine } from '../../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const { lineId } = paramsWith(event, QuoteLineParamsSchema)
  const body = await bodyWith(event, QuoteLineUpdateSchema)
  const { auth, quote } = await loadOwnQuote(event)
  return quoteAnswer(await changeQuoteLine(quote, auth, lineId, body), auth)
})
