/**
 * POST /api/quotes  { vehicleId, registration?, odometer?, ownerName, ownerEmail, ownerPhone?, inspectionId? }
 * Starts a draft quote for the caller's garage (technicians and managers). With `inspectionId` (one of this
 * garage's inspections of that vehicle) the findings are copied in plain words and the recommended parts become
 * required (fail) or advised lines. -> 201 QuoteDetail (+ `skipped`: recommendations that gave no line, and why).
 * 401 signed out; 403 without `quotes.draft`; 422 with `data.fields`.
 */
import { QuoteCreateSchema } from '#shared/schemas/quotes'
import { createQuote } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, QuoteCreateSchema)
  const auth = requireAbility(event, 'quotes.draft')
  const { quote, skipped } = await createQuote(auth, body)
  setResponseStatus(event, 201)
  return { ...(await quoteAnswer(quote, auth)), skipped }
})
