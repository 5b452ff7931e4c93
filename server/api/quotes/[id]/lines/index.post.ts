/**
 * POST /api/quotes/:id/lines
 *   { kind: "part" | "labour" | "sundry" | "discount", sku?, quantity?, description?, hours?, amountMinor?,
 *     recommendation?: "required" | "advised", markupBp?, rateMinor?, taxBp?, taxIncluded? }
 * A part line captures the garage's net price now (active price version less its tier), applies the garage's
 * markup rule (stated with tax when the garage shows prices so, then its price ending) and, for a remanufactured
 * unit, adds a core-deposit line (taxed at the part's rate; absorbed by the garage unless it passes deposits on). Labour takes the
 * garage's rate. Sundries and discounts take `amountMinor` (a discount's size, taken off), with tax included when
 * `taxIncluded` (default: the garage's setting). Prices, markups, rates, tax rates and discounts are set by
 * managers; technicians add parts, labour and unpriced sundries.
 * On a quote that has left draft the line goes into a new revision. -> 201 QuoteDetail (+ `addedLineIds`).
 * 401; 422 with `data.fields`; 404 not this garage's quote; 403 pricing by a technician; 409 a replaced revision.
 */
import { QuoteLineCreateSchema } from '#shared/schemas/quotes'
import { addQuoteLine } from '../../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, QuoteLineCreateSchema)
  const { auth, quote } = await loadOwnQuote(event)
  const { quote: target, addedLineIds } = await addQuoteLine(quote, auth, body)
  setResponseStatus(event, 201)
  return { ...(await quoteAnswer(target, auth)), addedLineIds }
})
