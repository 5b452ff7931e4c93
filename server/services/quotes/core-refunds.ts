/**
 * A core deposit the garage passed on to the vehicle owner is the owner's to get back only when the garage
 * gets it back: when the distributor accepts the old unit. This records the refund due to the owner on the
 * quote's deposit line, in the counter's transaction that accepts the core (never earlier), for the approved
 * part lines of the quote the order was placed from. Deposits the garage absorbed owe the owner nothing. The
 * refund is the deposit with its tax, as charged (rule 4 of shared/utils/quote-totals.ts): for n units,
 * n x unit + (n x unit x rate, rounded half away from zero once), so refunding every unit returns the line's gross.
 */
import type { Transaction } from 'sequelize'
import type { Order } from '../../models/orders'
import { Quote } from '../../models/quotes'
import { audit } from '../../utils/audit'
import { divRoundHalfUp } from '../../../shared/utils/money'
import { linesOf } from './rows'

/** What `units` old units bring back to the owner: the deposit and its tax. */
function refundFor(units: number, unitMinor: number, taxBp: number): number {
  const net = units * unitMinor
  return net + divRoundHalfUp(net * taxBp, 10_000)
}

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
    let refundedUnits = 0
    while (refundedUnits < core.quantity && refundFor(refundedUnits + 1, core.unitPriceMinor, core.taxBp) <= core.coreRefundMinor) refundedUnits++
    const units = Math.min(left, core.quantity - refundedUnits)
    if (units <= 0) continue
    const before = core.coreRefundMinor
    core.coreRefundMinor = refundFor(refundedUnits + units, core.unitPriceMinor, core.taxBp)
    core.coreRefundRecordedAt = at
    await core.save({ transaction: t })
    left -= units
    recorded += core.coreRefundMinor - before
  }
  if (recorded > 0) {
    await audit(t, {
      actorUserId, organisationId: quote.organisationId, action: 'quote.core_refund', entity: 'quote', entityId: quote.id,
      changes: { sku, units: accepted.quantity - left, amountMinor: recorded },
    })
  }
  return recorded
}
