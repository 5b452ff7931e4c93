/**
 * GET /api/quotes/:id/also-needed -> { data: [{ sku, relation, quantity, reason, description, fits, forSku }] }:
 * what the quote's parts need beside them (fitting kits, sensors, pads with discs, fluid by the vehicle's
 * capacity) that fits its vehicle and is not on the quote yet; each is added with POST /api/quotes/:id/lines.
 * 401; 404 not this garage's quote; 403 without `quotes.draft`.
 */
import { quoteAlsoNeeded } from '../../../services/jobs/also-needed'

export default defineEventHandler(async (event) => {
  const { quote } = await loadOwnQuote(event)
  return { data: await quoteAlsoNeeded(quote.id, quote.vehicleId ?? null) }
})
