/**
 * What each line of a placed order promises now: a line still to come is promised from where it stands (held
 * here: the next run or the counter; on transfer: from its arrival; back-ordered: from the supplier's expected
 * delivery, or from now if that has passed), and a line that waits for the rest takes the latest of what it
 * waits for, as at ordering (supply-plan.ts). Sent and cancelled lines say so. Pure.
 */
import type { OrderLine, Order } from '../../models/orders'
import { promiseWords, whenReady, type BranchTimes, type When } from './promise'

export interface LinePromise { arrivesAt: Date | null; promise: string }

const LIVE = ['reserved', 'waiting', 'picked']

export function linePromises(order: Pick<Order, 'fulfilment' | 'collect'>, lines: readonly OrderLine[], home: BranchTimes, now: Date, timeZone: string, names: Map<number, string>): Map<number, LinePromise> {
  const out = new Map<number, LinePromise>()
  const whens = new Map<number, When | null>()
  const live = lines.filter((l) => LIVE.includes(l.state ?? 'reserved'))
  for (const l of live) {
    const from = l.readyAt && l.readyAt.getTime() > now.getTime() ? l.readyAt : now
    whens.set(l.id, whenReady(home, from, !!order.collect, timeZone))
  }
  const latest = (group: OrderLine[]) => group.reduce<OrderLine | null>((best, l) => {
    const a = whens.get(l.id)?.arrivesAt.getTime() ?? Infinity
    const b = best ? whens.get(best.id)?.arrivesAt.getTime() ?? Infinity : -Infinity
    return a > b ? l : best
  }, null)
  for (const l of live) {
    let lead = l
    if (order.fulfilment === 'wait_for_all') lead = latest(live) ?? l
    else if (l.fulfilment === 'wait_for_all') lead = latest(live.filter((o) => o.lineGroup === l.lineGroup)) ?? l
    const when = whens.get(lead.id) ?? null
    const words = promiseWords(when, now, timeZone)
    const prefix = lead.id !== l.id ? 'sent with the rest: '
      : l.state === 'waiting' ? 'back-ordered from the supplier: '
        : l.source === 'transfer' && l.readyAt && l.readyAt > now ? `by transfer from ${names.get(l.sourceBranchId ?? 0) ?? 'another branch'}: ` : ''
    out.set(l.id, { arrivesAt: when?.arrivesAt ?? null, promise: `${prefix}${words}` })
  }
  for (const l of lines) {
    if (out.has(l.id)) continue
    out.set(l.id, l.state === 'cancelled' ? { arrivesAt: null, promise: 'cancelled' } : { arrivesAt: l.promisedAt ?? null, promise: 'sent' })
  }
  return out
}
