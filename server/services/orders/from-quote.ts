/**
 * From an owner-approved quote to order lines: the approved part lines of the caller's own quote, with the
 * unit net price the quote captured so the order can show what changed when it is re-priced. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { Quote, QuoteLine } from '../../models/quotes'
import { Order } from '../../models/orders'
import { orderReference } from '../../../shared/types/orders'
import { DomainError, notFound, conflict, invalidInput } from '../errors'
import { checkFit } from '../jobs/fitment-guard'

export interface QuoteOrderLine { sku: string; quantity: number; quoteLineId: number; quotedUnitNetMinor: number | null }

const ORDERABLE = ['approved', 'partly_approved']

export async function linesFromQuote(organisationId: number, quoteId: number, t?: Transaction): Promise<{ lines: QuoteOrderLine[]; skipped: { sku: string; reason: string }[] }> {
  const quote = await Quote.findOne({ where: { id: quoteId, organisationId }, transaction: t })
  if (!quote) throw notFound('Quote')
  if (!ORDERABLE.includes(quote.status ?? '')) {
    throw conflict(`Only a quote the owner has approved (in full or in part) can be ordered; this one is ${String(quote.status).replace('_', ' ')}.`)
  }
  const already = await Order.findOne({
    where: { organisationId, quoteId, status: { [Op.notIn]: ['cancelled', 'lapsed'] } }, transaction: t,
  })
  if (already) {
    throw new DomainError('conflict', `This quote was already ordered as ${orderReference(already.id)}.`, { details: { orderId: already.id } })
  }
  const rows = await QuoteLine.findAll({ where: { quoteId: quote.id, kind: 'part' }, order: [['position', 'ASC'], ['id', 'ASC']], transaction: t })
  const skipped: { sku: string; reason: string }[] = []
  const merged = new Map<string, QuoteOrderLine>()
  for (const l of rows) {
    // a line the owner did not decide on counts as approved only when the whole quote was approved
    const approved = l.ownerDecision === 'approved' || (l.ownerDecision == null && quote.status === 'approved')
    if (!approved) continue
    if (!l.sku) {
      skipped.push({ sku: l.description, reason: 'not a catalogue part (order it separately)' })
      continue
    }
    // the fitment guard again, as when the line was added: the catalogue may have changed since the quote. A part
    // that does not fit stops the order (the manager re-quotes it); the manager's override with a reason stands.
    if (quote.vehicleId && l.partId && !l.fitOverrideReason && (await checkFit(quote.vehicleId, l.partId, {}, t)).status === 'none') {
      throw invalidInput({ sku: `${l.sku} does not fit ${quote.vehicleLabel || 'the vehicle'} by the catalogue now: take it off the quote or add it again with the reason it is right.` },
        `${l.sku} does not fit ${quote.vehicleLabel || 'the vehicle'} by the catalogue now.`)
    }
    const key = l.sku.toUpperCase()
    const prev = merged.get(key)
    if (prev) prev.quantity += l.quantity ?? 1
    else merged.set(key, { sku: l.sku, quantity: l.quantity ?? 1, quoteLineId: l.id, quotedUnitNetMinor: l.unitNetMinor ?? null })
  }
  return { lines: [...merged.values()], skipped }
}
