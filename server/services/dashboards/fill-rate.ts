/**
 * First-time fill rate. A requested line is what the garage asked for on one line of an order; placing may split it
 * into pieces (from the shelf, by transfer, back-ordered: same order and line group) and a short pick splits a piece
 * again (`splitFromLineId`). A requested line counts once all its pieces are finished (sent or cancelled, at least
 * one sent); it was filled first time when every piece came from the home branch's shelf (or its counter), was sent,
 * and none was split at picking. Rate = filled / counted (common practice: "lines shipped complete from the first
 * location / lines shipped"). Pure; the dashboard sums the same rule in SQL (`sumDays` in day-figures.ts), so a change here goes there too.
 */
import type { LineState, SupplySource } from '../../../shared/types/orders'

export interface LinePiece { orderId: number; lineGroup: number; source: SupplySource; state: LineState; splitFromLineId: number | null }

const FROM_HOME: readonly SupplySource[] = ['home', 'collect']

export function fillRateOf(pieces: readonly LinePiece[]): { lines: number; filled: number } {
  const groups = new Map<string, LinePiece[]>()
  for (const p of pieces) {
    const key = `${p.orderId}:${p.lineGroup}`
    const g = groups.get(key)
    if (g) g.push(p)
    else groups.set(key, [p])
  }
  let lines = 0
  let filled = 0
  for (const g of groups.values()) {
    const finished = g.every((p) => p.state === 'dispatched' || p.state === 'cancelled') && g.some((p) => p.state === 'dispatched')
    if (!finished) continue
    lines++
    if (g.every((p) => FROM_HOME.includes(p.source) && p.state === 'dispatched' && p.splitFromLineId === null)) filled++
  }
  return { lines, filled }
}
