/**
 * PATCH /api/quotes/:id/lines/:lineId
 *   { quantity?, description?, hours?, recommendation?, amountMinor?, unitPriceMinor?, markupBp?, rateMinor?,
 *     taxBp?, coreCharge?: "charged" | "absorbed", toldOwnerDeclinedRequired?, position? }
 * Technicians change quantities, hours, descriptions and recommendations; prices, markups, rates, tax rates and
 * core-deposit charging are managers'; so is recording that the owner was told what declining a required line
 * means. A field that does not apply to the line's kind is refused (422). On a quote that has left draft the
 * change goes into a new revision (the line there has a new id), except that record alone on a quote still with
 * the owner: it changes no price or line, and lets the owner decline that line through the link they have.
 * -> QuoteDetail.
 * 401; 422; 404 not this garage's quote or line; 403; 409 a replaced revision.
 */
import { QuoteLineParamsSchema, QuoteLineUpdateSchema } from '#shared/schemas/quotes'
import { effectiveQuoteStatus } from '#shared/utils/quote-states'
import { QuoteLine } from '../../../../models/quotes'
import { assertDiscountsFit, changeLine, editableQuote } from '../../../../services/quotes'

const PRICING = ['unitPriceMinor', 'markupBp', 'rateMinor', 'taxBp', 'amountMinor', 'coreCharge'] as const

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const { lineId } = paramsWith(event, QuoteLineParamsSchema)
  const body = await bodyWith(event, QuoteLineUpdateSchema)
  const { auth, quote } = await loadOwnQuote(event)
  const line = await QuoteLine.findOne({ where: { id: lineId, quoteId: quote.id } })
  if (!line) throw notFound('Quote line')
  if (PRICING.some((k) => body[k] !== undefined)) requirePricing(event, 'change prices, markups, rates or tax')
  if (body.toldOwnerDeclinedRequired !== undefined && !can(auth.user.role, 'quotes.send')) {
    throw forbidden('Only a garage manager can record what the owner was told.')
  }
  const toldOnly = Object.entries(body).every(([k, v]) => v === undefined || k === 'toldOwnerDeclinedRequired')
  const target = await withWrite(async (t) => {
    const inPlace = toldOnly && effectiveQuoteStatus(quote.status, quote.expiresAt ?? null) === 'sent'
    const { quote: q, lineIds } = inPlace ? { quote, lineIds: null } : await editableQuote(t, quote, auth.user.id)
    const row = await QuoteLine.findOne({ where: { id: lineIds?.get(line.id) ?? line.id, quoteId: q.id }, transaction: t })
    if (!row) throw notFound('Quote line')
    await changeLine(t, row, body, auth.user.id)
    await assertDiscountsFit(t, q.id)
    await audit(t, {
      actorUserId: auth.user.id, organisationId: auth.org.id, action: 'quote.line.change', entity: 'quote', entityId: q.id,
      changes: { line: row.id, ...body },
    })
    return q
  })
  return quoteAnswer(target, auth)
})
