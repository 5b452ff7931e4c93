/**
 * POST /api/quotes/:id/lines/from-inspection  { inspectionId?, choices?: [{ index, sku | null }] }
 * Turns one of this garage's inspections of the quote's vehicle (default: the one the quote was drafted from)
 * into lines: each recommended part type gets the first catalogue part that certainly fits (or the SKU chosen
 * for that recommendation, or none when the choice is null), marked required for a fail verdict and advised for
 * an advise verdict, with the finding as its reason. The findings are copied onto the quote in plain words.
 * -> QuoteDetail + `added` (line count) + `skipped` [{ index, what, why }].
 * 401; 422; 404 not this garage's quote; 403 without `quotes.draft`; 409 a replaced revision.
 */
import { FromInspectionSchema } from '#shared/schemas/quotes'
import { draftFromInspection } from '../../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, FromInspectionSchema)
  const { auth, quote } = await loadOwnQuote(event)
  const { quote: target, added, skipped } = await draftFromInspection(quote, auth, body)
  return { ...(await quoteAnswer(target, auth)), added, skipped }
})
