/**
 * A card order whose checkout lapsed is priced again before it can be paid: days later its parts may cost something
 * else, and the garage pays today's net prices, not the ones it saw then. When anything changed the lines and totals
 * are rewritten (audited) and the garage sees the new total before paying; a part that has no current price any more
 * cannot be paid for at all (the order can still be cancelled). Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Organisation } from '../../models/accounts'
import { OrderLine, type Order } from '../../models/orders'
import { audit } from '../../utils/audit'
import { orderTotals } from '../../../shared/utils/order-totals'
import { conflict } from '../errors'
import { garagePrices } from '../pricing'

export interface PriceChange { previousTotalMinor: number; totalMinor: number }

/**
 * Prices the lapsed order's lines at the garage's net prices today, inside the caller's write; returns what changed
 * (the order and its lines are updated), or null when every price is as it was. 409 when a part has gone.
 */
export async function repriceLapsedOrder(t: Transaction, order: Order, actorUserId: number | null): Promise<PriceChange | null> {
  const org = await Organisation.findByPk(order.organisationId, { transaction: t })
  const lines = [...(order.lines ?? [])]
  const prices = await garagePrices({ tierId: org?.tierId ?? null }, lines.map((l) => l.sku), t)
  const gone = lines.filter((l) => { const p = prices.get(l.sku); return !p || p.part.status === 'discontinued' })
  if (gone.length) {
    throw conflict(`${gone.map((l) => l.sku).join(', ')} can no longer be ordered at a current price, so this order cannot be paid. Cancel it and order again.`)
  }
  const fresh = lines.map((l) => {
    const p = prices.get(l.sku)!
    return { line: l, unitListMinor: p.listPriceMinor, unitNetMinor: p.unitNetMinor, coreDepositUnitMinor: p.coreDepositMinor, quantity: l.quantity }
  })
  const same = fresh.every((f) => f.unitNetMinor === f.line.unitNetMinor && f.coreDepositUnitMinor === f.line.coreDepositUnitMinor && f.unitListMinor === f.line.unitListMinor)
  if (same) return null
  const totals = orderTotals(fresh, order.taxRateBp)
  for (const f of fresh) {
    const lineNetMinor = f.unitNetMinor * f.quantity
    await OrderLine.update(
      { unitListMinor: f.unitListMinor, unitNetMinor: f.unitNetMinor, lineNetMinor, coreDepositUnitMinor: f.coreDepositUnitMinor },
      { where: { id: f.line.id }, transaction: t },
    )
    Object.assign(f.line, { unitListMinor: f.unitListMinor, unitNetMinor: f.unitNetMinor, lineNetMinor, coreDepositUnitMinor: f.coreDepositUnitMinor })
  }
  const change = { previousTotalMinor: order.totalMinor, totalMinor: totals.totalMinor }
  Object.assign(order, { subtotalMinor: totals.subtotalMinor, coreDepositMinor: totals.coreDepositMinor, taxMinor: totals.taxMinor, totalMinor: totals.totalMinor })
  await order.save({ transaction: t })
  await audit(t, {
    actorUserId, organisationId: order.organisationId, action: 'order.repriced', entity: 'order', entityId: order.id,
    changes: { totalMinor: { from: change.previousTotalMinor, to: change.totalMinor } },
  })
  return change
}
