/**
 * Stock an order holds: taken off a branch's shelf in the order's own write transaction (guarded UPDATE, and
 * CHECK (quantity >= 0) underneath), put back when an unpaid checkout lapses, the order is cancelled before it
 * leaves, or a returned part is accepted back. Each line holds its units at its own branch (its source: the
 * order's branch, or the branch a transfer comes from); a back-ordered line holds nothing until stock arrives.
 * Plain Node.
 */
import type { Transaction } from 'sequelize'
import type { Branch } from '../../models/accounts'
import { StockLevel } from '../../models/catalogue'
import { OrderLine, type Order } from '../../models/orders'
import { getDb } from '../../utils/db'
import { changedRows } from '../../utils/sql'
import type { LineState } from '../../../shared/types/orders'
import { DomainError } from '../errors'
import { branchNames } from './branches'

/** Lines in these states have their units taken off a shelf. */
export const HOLDING_STATES: readonly LineState[] = ['reserved', 'picked']

/** What a line needs to hold stock: its part and quantity, and (when known) its own branch and state. */
export interface StockLine { partId: number; sku: string; quantity: number; sourceBranchId?: number | null; state?: LineState }

/** Takes `quantity` units off the shelf if there are that many; true when taken. */
export async function takeStock(t: Transaction, branchId: number, partId: number, quantity: number, now = new Date()): Promise<boolean> {
  const changed = await changedRows(
    'UPDATE stock_levels SET quantity = quantity - :q, updated_at = :now WHERE part_id = :p AND branch_id = :b AND quantity >= :q',
    { replacements: { q: quantity, p: partId, b: branchId, now }, transaction: t },
  )
  return changed === 1
}

/** Puts units on the shelf (a row is made for a part the branch never stocked; one statement, so two processes cannot both make it). */
export async function putStock(t: Transaction, branchId: number, partId: number, quantity: number, now = new Date()): Promise<void> {
  await getDb().query(
    `INSERT INTO stock_levels (part_id, branch_id, quantity, updated_at) VALUES (:p, :b, :q, :now)
     ON CONFLICT (part_id, branch_id) DO UPDATE SET quantity = stock_levels.quantity + excluded.quantity, updated_at = excluded.updated_at`,
    { replacements: { q: quantity, p: partId, b: branchId, now }, transaction: t },
  )
}

const holds = (l: StockLine) => !l.state || HOLDING_STATES.includes(l.state)

/**
 * Takes the units of every line that holds stock off its branch's shelf inside the caller's write transaction,
 * all or nothing: each (branch, part) with a guarded UPDATE whose affected-row count says whether there was
 * enough. Any shortage throws 409 "Only N left" (for every short line), and the caller's transaction rolls back
 * whatever was taken. Back-ordered lines take nothing.
 */
export async function reserveStock(t: Transaction, branch: Branch, lines: readonly StockLine[]): Promise<void> {
  const wanted = new Map<string, { branchId: number; partId: number; sku: string; quantity: number }>()
  for (const l of lines.filter(holds)) {
    const branchId = l.sourceBranchId ?? branch.id
    const key = `${branchId}:${l.partId}`
    const prev = wanted.get(key)
    if (prev) prev.quantity += l.quantity
    else wanted.set(key, { branchId, partId: l.partId, sku: l.sku, quantity: l.quantity })
  }
  const shortages: { sku: string; available: number; wanted: number; branchId: number }[] = []
  for (const w of wanted.values()) {
    if (await takeStock(t, w.branchId, w.partId, w.quantity)) continue
    const row = await StockLevel.findOne({ where: { partId: w.partId, branchId: w.branchId }, transaction: t })
    shortages.push({ sku: w.sku, available: row?.quantity ?? 0, wanted: w.quantity, branchId: w.branchId })
  }
  if (shortages.length) {
    const names = await branchNames(shortages.map((s) => s.branchId), t)
    const text = shortages.map((s) => `Only ${s.available} left of ${s.sku} at ${s.branchId === branch.id ? branch.name : names.get(s.branchId) ?? 'the branch'} (you asked for ${s.wanted}).`).join(' ')
    throw new DomainError('conflict', text, { details: { shortages: shortages.map(({ sku, available, wanted: w }) => ({ sku, available, wanted: w })) } })
  }
}

/** Puts an order's held units back on their shelves (once: `stock_held` goes false). */
export async function releaseStock(t: Transaction, order: Order): Promise<void> {
  if (!order.stockHeld) return
  const lines = order.lines ?? await OrderLine.findAll({ where: { orderId: order.id }, transaction: t })
  for (const l of lines) {
    if (!holds(l)) continue
    await putStock(t, l.sourceBranchId ?? order.branchId, l.partId, l.quantity)
  }
  order.stockHeld = false
  await order.save({ transaction: t })
}

/** Are there enough units for every line that holds stock (inside the write lock, so nothing moves meanwhile)? */
export async function stockSuffices(t: Transaction, order: Order): Promise<boolean> {
  const need = new Map<string, { branchId: number; partId: number; quantity: number }>()
  for (const l of (order.lines ?? []).filter(holds)) {
    const branchId = l.sourceBranchId ?? order.branchId
    const key = `${branchId}:${l.partId}`
    const prev = need.get(key)
    if (prev) prev.quantity += l.quantity
    else need.set(key, { branchId, partId: l.partId, quantity: l.quantity })
  }
  for (const n of need.values()) {
    const row = await StockLevel.findOne({ where: { partId: n.partId, branchId: n.branchId }, transaction: t })
    if ((row?.quantity ?? 0) < n.quantity) return false
  }
  return true
}
