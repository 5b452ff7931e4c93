/**
 * The garage's changes to a quote's lines: add, change, remove. Each applies to the draft, or to a new revision
 * of a quote that has left draft (the line there has a new id), keeps discounts within the rest of the quote,
 * and is audited. Pricing is managers' (403 for others, before anything is written).
 */
import { Op } from 'sequelize'
import { QuoteLine, type Quote } from '../../models/quotes'
import { effectiveQuoteStatus } from '../../../shared/utils/quote-states'
import type { QuoteLineCreateInput, QuoteLineUpdateInput } from '../../../shared/schemas/quotes'
import { can } from '../../../shared/utils/abilities'
import { conflict, forbidden, notFound } from '../errors'
import { assertDiscountsFit, assertMayPrice } from './line-pricing'
import { addLine, changeLine } from './lines'
import { changeQuote, type QuoteActor } from './revisions'
import { settingsOf } from './settings'

/** One line of this quote (404 when the id is another quote's). */
async function lineOf(quote: Pick<Quote, 'id'>, lineId: number): Promise<QuoteLine> {
  const line = await QuoteLine.findOne({ where: { id: lineId, quoteId: quote.id } })
  if (!line) throw notFound('Quote line')
  return line
}

/** Adds a line (a part brings its core deposit); returns the quote that holds it and the new line ids. */
export async function addQuoteLine(quote: Quote, actor: QuoteActor, input: QuoteLineCreateInput): Promise<{ quote: Quote; addedLineIds: number[] }> {
  assertMayPrice(actor.user.role, input)
  if (input.override && !can(actor.user.role, 'quotes.price')) throw forbidden('Only a garage manager can put on a part that does not fit.')
  return changeQuote(quote, actor, 'quote.line.add', async (t, { quote: q }) => {
    const lines = await addLine(t, q, actor.org, input)
    await assertDiscountsFit(t, q.id)
    return {
      result: { quote: q, addedLineIds: lines.map((l) => l.id) },
      changes: {
        kind: input.kind, sku: lines[0]!.sku, quantity: lines[0]!.quantity, amountMinor: lines[0]!.amountMinor, lines: lines.map((l) => l.id),
        ...(lines[0]!.fitOverrideReason ? { fitOverride: lines[0]!.fitOverrideReason } : {}),
      },
    }
  })
}

/**
 * Changes one line. Recording alone that the owner was talked through what declining a required line means
 * applies in place to a quote still with the owner: it changes no price or line, only the garage's record.
 */
export async function changeQuoteLine(quote: Quote, actor: QuoteActor, lineId: number, input: QuoteLineUpdateInput): Promise<Quote> {
  const line = await lineOf(quote, lineId)
  assertMayPrice(actor.user.role, input, 'change prices, markups, rates or tax')
  const toldOnly = Object.entries(input).every(([k, v]) => v === undefined || k === 'toldOwnerDeclinedRequired')
  const inPlace = toldOnly && effectiveQuoteStatus(quote.status, quote.expiresAt ?? null) === 'sent'
  return changeQuote(quote, actor, 'quote.line.change', async (t, { quote: q, lineIds }) => {
    const row = await QuoteLine.findOne({ where: { id: lineIds?.get(line.id) ?? line.id, quoteId: q.id }, transaction: t })
    if (!row) throw notFound('Quote line')
    await changeLine(t, row, input, actor.user.id, await settingsOf(actor.org.id, t))
    await assertDiscountsFit(t, q.id)
    return { result: q, changes: { line: row.id, ...input } }
  }, { inPlace })
}

/** Removes a line with its core deposit (a core deposit alone cannot go: 409). */
export async function removeQuoteLine(quote: Quote, actor: QuoteActor, lineId: number): Promise<Quote> {
  const line = await lineOf(quote, lineId)
  if (line.kind === 'core_deposit') {
    throw conflict('A core deposit goes with its part: remove the part, or leave the deposit absorbed by the garage.')
  }
  return changeQuote(quote, actor, 'quote.line.remove', async (t, { quote: q, lineIds }) => {
    const id = lineIds?.get(line.id) ?? line.id
    await QuoteLine.destroy({ where: { quoteId: q.id, [Op.or]: [{ id }, { parentLineId: id }] }, transaction: t })
    await assertDiscountsFit(t, q.id)
    return { result: q, changes: { line: id, kind: line.kind, sku: line.sku, amountMinor: line.amountMinor } }
  })
}
