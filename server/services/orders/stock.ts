/**
 * Stock an order holds: taken off the branch's shelf in the order's own write transaction (guarded UPDATE, and
 * CHECK (quantity >= 0) underneath), put back when an unpaid checkout lapses or the order is cancelled before it
 * leaves. Plain Node.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import type { Branch } from '../../models/accounts'
import { StockLevel } from '../../models/catalogue'
import { OrderLine, type Order } from '../../models/orders'
import { getDb } from '../../utils/db'
import { DomainError } from '../errors'

/**
 * Takes the units off the branch's shelf inside the caller's write transaction, all or nothing: each part
 * with a guarded UPDATE whose affected-row count says whether there was enough. Any shortage throws 409
 * "Only N left" (for every short line), and the caller's transaction rolls back whatever was taken.
 */
export async function reserveStock(t: Transaction, branch: Branch, lines: readonly { partId: number; sku: string; quantity: number }[]): Promise<void> {
  const byPart = new Map<number, { sku: string; quantity: number }>()
  for (const l of lines) {
    const prev = byPart.get(l.partId)
    if (prev) prev.quantity += l.quantity
    else byPart.set(l.partId, { sku: l.sku, quantity: l.quantity })
  }
  const shortages: { sku: string; available: number; wanted: number }[] = []
  for (const [partId, l] of byPart) {
    const [, changed] = await getDb().query(
      'UPDATE stock_levels SET quantity = quantity - :q, updated_at = :now WHERE part_id = :p AND branch_id = :b AND quantity >= :q',
      { replacements: { q: l.quantity, p: partId, b: branch.id, now: new Date() }, type: QueryTypes.UPDATE, transaction: t },
    ) as unknown as [unknown, number]
    if (changed === 1) continue
    const row = await StockLevel.findOne({ where: { partId, branchId: branch.id }, transaction: t })
    shortages.push({ sku: l.sku, available: row?.quantity ?? 0, wanted: l.quantity })
  }
  if (shortages.length) {
    const text = shortages.map((s) => `Only ${s.available} left of ${s.sku} at ${branch.name} (you asked for ${s.wanted}).`).join(' ')
    throw new DomainError('conflict', text, { details: { shortages } })
  }
}

/** Puts an order's units back on its branch's shelf (once: `stock_held` goes false). */
export async function releaseStock(t: Transaction, order: Order): Promise<void> {
  if (!order.stockHeld) return
  const lines = order.lines ?? await OrderLine.findAll({ where: { orderId: order.id }, transaction: t })
  for (const l of lines) {
    const [, changed] = await getDb().query(
      'UPDATE stock_levels SET quantity = quantity + :q, updated_at = :now WHERE part_id = :p AND branch_id = :b',
      { replacements: { q: l.quantity, p: l.partId, b: order.branchId, now: new Date() }, type: QueryTypes.UPDATE, transaction: t },
    ) as unknown as [unknown, number]
    if (changed === 0) await StockLevel.create({ partId: l.partId, branchId: order.branchId, quantity: l.quantity, updatedAt: new Date() }, { transaction: t })
  }
  order.stockHeld = false
  await order.save({ transaction: t })
}

/** Are there enough units at the branch for every line (inside the write lock, so nothing moves meanwhile)? */
export async function stockSuffices(t: Transaction, order: Order): Promise<boolean> {
  for (const l of order.lines ?? []) {
    const row = await StockLevel.findOne({ where: { partId: l.partId, branchId: order.branchId }, transaction: t })
    if ((row?.quantity ?? 0) < l.quantity) return false
  }
  return true
}
