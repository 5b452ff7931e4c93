/**
 * A core deposit the garage passed on to the vehicle owner is the owner's to get back only when the garage
 * gets it back: when the distributor accepts the old unit. This records the refund due to the owner on the
 * quote's deposit line, in the counter's transaction that accepts the core (never earlier), for the approved
 * part lines of the quote the order was placed from. Deposits the garage absorbed owe the owner nothing.
 */
import type { Transaction } from 'sequelize'
import type { Order } from '../../models/orders'
import { Quote } from '../../models/quotes'
import { audit } from '../../utils/audit'
import { linesOf } from './rows'

export interface AcceptedCore {
  order: Pick<Order, 'organisationId' | 'quoteId'>
  sku: string
  /** old units the distributor accepted */
  quantity: number
  actorUserId: number
}

/** Records the owner's refund for the accepted units; returns the amount recorded (0 when none is due). */
export async function recordOwnerCoreRefunds(t: Transaction, accepted: AcceptedCore, at = new Date()): Promise<number> {
  const { order, sku, actorUserId } = accepted
  if (!order.quoteId || accepted.quantity <= 0) return 0
  const quote = await Quote.findOne({ where: { id: order.quoteId, organisationId: order.organisationId }, transaction: t })
  if (!quote) return 0
  const lines = await linesOf(quote.id, t)
  const approved = (l: (typeof lines)[number]) => l.ownerDecision === 'approved' || (l.ownerDecision == null && quote.status === 'approved')
  const parts = lines.filter((l) => l.kind === 'part' && l.sku?.toUpperCase() === sku.toUpperCase() && approved(l))
  let left = accepted.quantity
  let recorded = 0
  for (const core of lines.filter((c) => c.kind === 'core_deposit' && c.coreCharge === 'charged' && parts.some((p) => p.id === c.parentLineId))) {
    const refundedUnits = core.unitPriceMinor > 0 ? Math.round(core.coreRefundMinor / core.unitPriceMinor) : core.quantity
    const units = Math.min(left, core.quantity - refundedUnits)
    if (units <= 0) continue
    core.coreRefundMinor += units * core.unitPriceMinor
    core.coreRefundRecordedAt = at
    await core.save({ transaction: t })
    left -= units
    recorded += units * core.unitPriceMinor
  }
  if (recorded > 0) {
    await audit(t, {
      actorUserId, organisationId: quote.organisationId, action: 'quote.core_refund', entity: 'quote', entityId: quote.id,
      changes: { sku, units: accepted.quantity - left, amountMinor: recorded },
    })
  }
  return recorded
}
