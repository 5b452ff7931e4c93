/**
 * Picking: which lines the counter can pick now (held at the branch, a transfer that has arrived, and not waiting
 * for the rest of a "wait for all" line or order) and the pick list walked in bin order. Plain Node.
 */
import { Op } from 'sequelize'
import type { Order, OrderLine } from '../../models/orders'
import { StockBin } from '../../models/counter'
import type { PickLine } from '../../../shared/types/orders'
import type { ViewClock } from './clock'
import { clockText, localParts } from './zoned-time'

const LIVE = ['reserved', 'waiting', 'picked']

/** Held here and arrived: the line itself could go now. */
function atHand(l: OrderLine, now: Date): boolean {
  return (l.state === 'reserved' || l.state === 'picked') && (!l.readyAt || l.readyAt.getTime() <= now.getTime())
}

/** For each live line: can it be picked now, and if not, what it waits for. */
export function readiness(order: Pick<Order, 'fulfilment'>, lines: readonly OrderLine[], now: Date, timeZone: string, names: Map<number, string>): Map<number, string | null> {
  const live = lines.filter((l) => LIVE.includes(l.state ?? 'reserved'))
  const out = new Map<number, string | null>()
  const orderWaits = order.fulfilment === 'wait_for_all' && live.some((l) => !atHand(l, now))
  for (const l of live) {
    let why: string | null = null
    if (l.state === 'waiting') why = 'back-ordered: waiting for the supplier'
    else if (!atHand(l, now)) why = `on transfer from ${names.get(l.sourceBranchId ?? 0) ?? 'another branch'}, due ${clockText(localParts(l.readyAt!, timeZone).minute)}`
    else if (l.fulfilment === 'wait_for_all' && live.some((o) => o.lineGroup === l.lineGroup && !atHand(o, now))) why = 'waits for the rest of its line'
    else if (orderWaits) why = 'waits for the rest of the order'
    out.set(l.id, why)
  }
  return out
}

/** The pick list in bin order (lines without a bin last), with what each waits for. */
export async function pickList(order: Order, clock: ViewClock, names: Map<number, string>): Promise<PickLine[]> {
  const lines = order.lines ?? []
  const why = readiness(order, lines, clock.now, clock.timeZone, names)
  const bins = await StockBin.findAll({ where: { branchId: order.branchId, partId: { [Op.in]: lines.map((l) => l.partId) } } })
  const binOf = new Map(bins.map((b) => [b.partId, b.bin]))
  return lines.filter((l) => why.has(l.id)).map((l) => ({
    lineId: l.id, sku: l.sku, description: l.description, quantity: l.quantity, bin: binOf.get(l.partId) ?? '',
    source: l.source ?? 'home', ready: why.get(l.id) === null, waitingFor: why.get(l.id) ?? null, pickedQuantity: l.pickedQuantity ?? null,
  })).sort((a, b) => (a.bin === '' ? 1 : 0) - (b.bin === '' ? 1 : 0) || a.bin.localeCompare(b.bin) || a.sku.localeCompare(b.sku))
}

