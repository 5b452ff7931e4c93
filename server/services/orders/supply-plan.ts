/**
 * Split supply instead of refusal: each requested line is filled from the order's branch shelf as far as it
 * goes, the rest by transfer from the other branches (the quickest transfer first), and what no branch has is
 * back-ordered from the supplier. Each piece gets its promise; a piece that waits for the rest of its line (the
 * garage's "wait for all") takes the latest promise of its line, and with "wait for all" on the whole order every
 * line takes the order's latest. Pure: stock counts (what new orders may take: shelf less older back-orders) in,
 * the pieces out; the caller reserves what they say.
 */
import type { Fulfilment, SupplySource } from '../../../shared/types/orders'
import { promiseWords, supplierArrival, whenReady, type BranchTimes, type When } from './promise'

export interface Wanted {
  group: number
  partId: number
  quantity: number
  fulfilment: Fulfilment | undefined
}

export interface SupplyPiece {
  group: number
  partId: number
  quantity: number
  source: SupplySource
  /** where the units are held; null for a back-order */
  branch: BranchTimes | null
  readyAt: Date
  arrivesAt: Date | null
  promise: string
  fulfilment: Fulfilment
}

export interface PlanContext {
  home: BranchTimes
  /** the other branches (order does not matter: the quickest transfer is tried first) */
  others: BranchTimes[]
  /** units new orders may take, by `${branchId}:${partId}`; the plan takes from a copy */
  available: ReadonlyMap<string, number>
  now: Date
  timeZone: string
  collect: boolean
  fulfilment: Fulfilment
  supplierLeadDays: number
}

export const stockKey = (branchId: number, partId: number) => `${branchId}:${partId}`

/** The pieces for every requested line, and the promises they carry. */
export function planSupply(wanted: readonly Wanted[], c: PlanContext): SupplyPiece[] {
  const left = new Map(c.available)
  const take = (b: BranchTimes, partId: number, want: number) => {
    const k = stockKey(b.id, partId)
    const got = Math.max(0, Math.min(want, left.get(k) ?? 0))
    left.set(k, (left.get(k) ?? 0) - got)
    return got
  }
  const others = [...c.others].sort((a, b) => a.transferMinutes - b.transferMinutes || a.code.localeCompare(b.code))
  const pieces: Omit<SupplyPiece, 'arrivesAt' | 'promise'>[] = []
  for (const w of wanted) {
    const fulfilment = c.fulfilment === 'wait_for_all' ? 'wait_for_all' : (w.fulfilment ?? c.fulfilment)
    const base = { group: w.group, partId: w.partId, fulfilment }
    let rest = w.quantity
    const here = take(c.home, w.partId, rest)
    if (here) pieces.push({ ...base, quantity: here, source: c.collect ? 'collect' : 'home', branch: c.home, readyAt: c.now })
    rest -= here
    for (const b of others) {
      if (!rest) break
      const moved = take(b, w.partId, rest)
      if (moved) pieces.push({ ...base, quantity: moved, source: 'transfer', branch: b, readyAt: new Date(c.now.getTime() + b.transferMinutes * 60_000) })
      rest -= moved
    }
    if (rest) pieces.push({ ...base, quantity: rest, source: 'back_order', branch: null, readyAt: supplierArrival(c.home, c.now, c.supplierLeadDays, c.timeZone) })
  }
  return promised(pieces, c)
}

const SOURCE_PREFIX: Record<SupplySource, (p: { branch: BranchTimes | null }) => string> = {
  home: () => '',
  collect: () => '',
  transfer: (p) => `by transfer from ${p.branch?.name ?? 'another branch'}: `,
  back_order: () => 'back-ordered from the supplier: ',
}

/** Arrival and words for each piece; a piece that waits takes the latest of what it waits for. */
function promised(pieces: Omit<SupplyPiece, 'arrivesAt' | 'promise'>[], c: PlanContext): SupplyPiece[] {
  const whens = pieces.map((p) => whenReady(c.home, p.readyAt, c.collect, c.timeZone))
  const latest = (indexes: number[]) => indexes.reduce((best, i) => (later(whens[i] ?? null, whens[best] ?? null) ? i : best), indexes[0]!)
  const all = pieces.map((_, i) => i)
  return pieces.map((p, i) => {
    let lead = i
    if (c.fulfilment === 'wait_for_all') lead = latest(all)
    else if (p.fulfilment === 'wait_for_all') lead = latest(all.filter((j) => pieces[j]!.group === p.group))
    const when = whens[lead] ?? null
    const words = promiseWords(when, c.now, c.timeZone)
    const promise = lead === i ? `${SOURCE_PREFIX[p.source](p)}${words}` : `sent with the rest: ${words}`
    return { ...p, arrivesAt: when?.arrivesAt ?? null, promise }
  })
}

function later(a: When | null, b: When | null): boolean {
  if (!b) return false
  if (!a) return true
  return a.arrivesAt.getTime() > b.arrivesAt.getTime()
}
