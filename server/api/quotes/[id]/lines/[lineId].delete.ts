/**
 * DELETE /api/quotes/:id/lines/:lineId  -> QuoteDetail
 * Removes a line (a part takes its core deposit with it; a core deposit alone cannot go: remove its part or mark
 * it absorbed). On a quote that has left draft the removal happens in a new revision.
 * 401; 404 not this garage's quote or line; 403 without `quotes.draft`; 409 a core deposit or a replaced revision.
 */
import { Op } from 'sequelize'
import { QuoteLineParamsSchema } from '#shared/schemas/quotes'
import { QuoteLine } from '../../../../models/quotes'
import { assertDiscountsFit, editableQuote } from '../../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const { lineId } = paramsWith(event, QuoteLineParamsSchema)
  const { auth, quote } = await loadOwnQuote(event)
  const line = await QuoteLine.findOne({ where: { id: lineId, quoteId: quote.id } })
  if (!line) throw notFound('Quote line')
  if (line.kind === 'core_deposit') {
    throw conflict('A core deposit goes with its part: remove the part, or mark the deposit as absorbed by the garage.')
  }
  const target = await withWrite(async (t) => {
    const { quote: q, lineIds } = await editableQuote(t, quote, auth.user.id)
    const id = lineIds?.get(line.id) ?? line.id
    await QuoteLine.destroy({ where: { quoteId: q.id, [Op.or]: [{ id }, { parentLineId: id }] }, transaction: t })
    await assertDiscountsFit(t, q.id)
    await audit(t, {
      actorUserId: auth.user.id, organisationId: auth.org.id, action: 'quote.line.remove', entity: 'quote', entityId: q.id,
      changes: { line: id, kind: line.kind, sku: line.sku, amountMinor: line.amountMinor },
    })
    return q
  })
  return quoteAnswer(target, auth)
})
