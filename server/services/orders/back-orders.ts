/**
 * Back-orders filled when stock arrives (goods in at the counter, a price file's stock counts, a returned part put
 * back, a cancelled order's units released), in order of ordering: the oldest waiting line for a part at a branch
 * takes the units first, whole lines only. A line the shelf cannot fill keeps its place, and the lines behind it
 * for that part at that branch wait with it, so a later, smaller order never jumps the queue. Runs inside the
 * caller's write transaction; the garages are told after the commit. Plain Node apart from the e-mail.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { OrderLine } from '../../models/orders'
import { getDb, withWrite } from '../../utils/db'
import { orderReference } from '../../../shared/types/orders'
import { QUEUEING_STATUSES, branchTimes } from './branches'
import { promiseWords, whenReady } from './promise'
import { takeStock } from './stock'
import { sendToGarage } from './mail'

export interface Allocated {
  lineId: number
  orderId: number
  organisationId: number
  placedByUserId: number
  sku: string
  quantity: number
  promise: string
}

interface WaitingRow {
  id: number; orderId: number; organisationId: number; placedByUserId: number; branchId: number; collect: number
  partId: number; sku: string; quantity: number
}

/** Waiting lines of live orders whose branch has some of the part on the shelf (the only ones worth trying). */
const WAITING_WITH_STOCK = (someParts: boolean) => `
  SELECT l.id, l.order_id AS orderId, o.organisation_id AS organisationId, o.placed_by_user_id AS placedByUserId,
         o.branch_id AS branchId, o.collect, l.part_id AS partId, l.sku, l.quantity
    FROM order_lines l JOIN orders o ON o.id = l.order_id
   WHERE l.state = 'waiting' AND o.status IN (:live) AND o.stock_held = true ${someParts ? 'AND l.part_id IN (:parts)' : ''}
     AND EXISTS (SELECT 1 FROM stock_levels s WHERE s.part_id = l.part_id AND s.branch_id = o.branch_id AND s.quantity > 0)`

/** Fills waiting lines from the shelves, oldest order first (optionally only for some parts). */
export async function allocateBackOrders(t: Transaction, opts: { partIds?: number[]; now?: Date; timeZone: string }): Promise<Allocated[]> {
  if (opts.partIds && !opts.partIds.length) return []
  const now = opts.now ?? new Date()
  const rows = await getDb().query<WaitingRow>(`${WAITING_WITH_STOCK(!!opts.partIds)} ORDER BY o.created_at ASC, o.id ASC, l.id ASC`,
    { replacements: { live: QUEUEING_STATUSES, parts: opts.partIds ?? [] }, type: QueryTypes.SELECT, transaction: t })
  if (!rows.length) return []
  const times = new Map((await branchTimes(t)).map((b) => [b.id, b]))
  const blocked = new Set<string>()
  const out: Allocated[] = []
  for (const r of rows) {
    const key = `${r.branchId}:${r.partId}`
    if (blocked.has(key)) continue
    if (!await takeStock(t, r.branchId, r.partId, r.quantity, now)) {
      blocked.add(key)
      continue
    }
    const when = whenReady(times.get(r.branchId)!, now, !!r.collect, opts.timeZone)
    await OrderLine.update({
      state: 'reserved', sourceBranchId: r.branchId, reservedAt: now, readyAt: now, promisedAt: when?.arrivesAt ?? null,
    }, { where: { id: r.id, state: 'waiting' }, transaction: t })
    out.push({ ...r, lineId: r.id, promise: promiseWords(when, now, opts.timeZone) })
  }
  return out
}

/** Tells each garage which of its back-ordered lines are now held for it, and when they come. */
export async function tellBackOrdersFilled(allocated: Allocated[]): Promise<void> {
  const byOrder = new Map<number, Allocated[]>()
  for (const a of allocated) byOrder.set(a.orderId, [...(byOrder.get(a.orderId) ?? []), a])
  for (const [orderId, lines] of byOrder) {
    const first = lines[0]!
    const list = lines.map((l) => `  ${l.quantity} x ${l.sku}: ${l.promise}`).join('\n')
    await sendToGarage({ id: orderId, organisationId: first.organisationId, placedByUserId: first.placedByUserId },
      `Back-ordered parts are in for order ${orderReference(orderId)}`,
      `Parts you were waiting for have arrived and are now held for order ${orderReference(orderId)}:\n\n${list}\n\nWe will let you know when they leave.`)
  }
}

let seenStockRevision: number | null = null

/**
 * Fills back-orders when stock has moved since the last look, whoever moved it (a price file's stock counts, an
 * edit): the stock revision is bumped by triggers on every stock change (migration 0004). Returns the lines filled.
 */
export async function fillBackOrdersIfStockMoved(timeZone: string): Promise<number> {
  const [row] = await getDb().query<{ stock: number }>('SELECT stock FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT })
  const revision = Number(row?.stock ?? 0)
  if (revision === seenStockRevision) return 0
  seenStockRevision = revision
  // a read first: the write lock is taken only when some waiting line could be filled
  const candidates = await getDb().query(`${WAITING_WITH_STOCK(false)} LIMIT 1`, { replacements: { live: QUEUEING_STATUSES, parts: [] }, type: QueryTypes.SELECT })
  if (!candidates.length) return 0
  const filled = await withWrite((t) => allocateBackOrders(t, { timeZone }))
  // read again after our own writes: what we took moved the revision too
  const [after] = await getDb().query<{ stock: number }>('SELECT stock FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT })
  seenStockRevision = Number(after?.stock ?? revision)
  if (filled.length) await tellBackOrdersFilled(filled)
  return filled.length
}
