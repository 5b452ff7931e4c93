/**
 * The distributor's branches as the order side reads them: their delivery runs and counter hours (for promises),
 * the schedule the pages show, and the stock new orders may take at each (the shelf less what older back-orders
 * at that branch are waiting for, so a new order never jumps the queue). Plain Node.
 */
import { Op, QueryTypes, type Transaction } from 'sequelize'
import { Branch } from '../../models/accounts'
import { DeliveryRun } from '../../models/counter'
import { getDb } from '../../utils/db'
import { forUpdate } from '../../utils/sql'
import type { BranchSchedule } from '../../../shared/types/orders'
import type { BranchTimes } from './promise'
import { stockKey } from './supply-plan'
import { clockText } from './zoned-time'

/** Orders whose waiting lines hold a place in the back-order queue. */
export const QUEUEING_STATUSES = ['awaiting_payment', 'confirmed', 'picking', 'part_dispatched']

export async function branchTimes(t?: Transaction): Promise<BranchTimes[]> {
  const [branches, runs] = await Promise.all([
    Branch.findAll({ order: [['id', 'ASC']], transaction: t }),
    DeliveryRun.findAll({ order: [['departsMinute', 'ASC']], transaction: t }),
  ])
  return branches.map((b) => ({
    id: b.id, code: b.code, name: b.name, collection: b.collection ?? true,
    counterOpensMinute: b.counterOpensMinute ?? 450, counterClosesMinute: b.counterClosesMinute ?? 1050,
    collectionMinutes: b.collectionMinutes ?? 15, transferMinutes: b.transferMinutes ?? 180,
    runs: runs.filter((r) => r.branchId === b.id).map((r) => ({
      departsMinute: r.departsMinute, cutoffMinutes: r.cutoffMinutes ?? 30, transitMinutes: r.transitMinutes ?? 45, weekdays: r.weekdays ?? '12345',
    })),
  }))
}

export async function branchSchedules(): Promise<BranchSchedule[]> {
  const [times, rows] = await Promise.all([branchTimes(), Branch.findAll()])
  const address = new Map(rows.map((b) => [b.id, b.address ?? '']))
  return times.map((b) => ({
    id: b.id, code: b.code, name: b.name, address: address.get(b.id) ?? '', collection: b.collection,
    counterOpens: clockText(b.counterOpensMinute), counterCloses: clockText(b.counterClosesMinute), transferMinutes: b.transferMinutes,
    runs: b.runs.map((r) => ({ departs: clockText(r.departsMinute), cutoffMinutes: r.cutoffMinutes, transitMinutes: r.transitMinutes, weekdays: r.weekdays })),
  })).sort((a, b) => a.name.localeCompare(b.name))
}

/** Units new orders may take, by branch and part: the shelf less what older back-orders there wait for. */
export async function availableStock(partIds: number[], t?: Transaction): Promise<Map<string, number>> {
  const out = new Map<string, number>()
  if (!partIds.length) return out
  const ids = [...new Set(partIds)]
  const [shelf, waiting] = await Promise.all([
    getDb().query<{ partId: number; branchId: number; quantity: number }>(
      // inside a write (t): PostgreSQL locks the shelves until it ends, so a concurrent order plans on what this one leaves
      `SELECT part_id AS partId, branch_id AS branchId, quantity FROM stock_levels WHERE part_id IN (:ids)${t ? ` ORDER BY part_id, branch_id${forUpdate()}` : ''}`,
      { replacements: { ids }, type: QueryTypes.SELECT, transaction: t },
    ),
    getDb().query<{ partId: number; branchId: number; quantity: number }>(
      `SELECT l.part_id AS partId, o.branch_id AS branchId, SUM(l.quantity) AS quantity
         FROM order_lines l JOIN orders o ON o.id = l.order_id
        WHERE l.state = 'waiting' AND l.part_id IN (:ids) AND o.status IN (:live)
        GROUP BY l.part_id, o.branch_id`,
      { replacements: { ids, live: QUEUEING_STATUSES }, type: QueryTypes.SELECT, transaction: t },
    ),
  ])
  for (const s of shelf) out.set(stockKey(s.branchId, s.partId), Number(s.quantity))
  for (const w of waiting) {
    const k = stockKey(w.branchId, w.partId)
    out.set(k, Math.max(0, (out.get(k) ?? 0) - Number(w.quantity)))
  }
  return out
}

/** Branch names by id (messages, views). */
export async function branchNames(ids: number[], t?: Transaction): Promise<Map<number, string>> {
  if (!ids.length) return new Map()
  const rows = await Branch.findAll({ where: { id: { [Op.in]: [...new Set(ids)] } }, attributes: ['id', 'name'], transaction: t })
  return new Map(rows.map((b) => [b.id, b.name]))
}
