/**
 * The range's sold lines summed in the database (GROUP BY), so a year of lines never crosses into JS: sales per
 * garage and branch with the requested lines by fill state, per local day, and per part and the price version active
 * when its order was placed (for the top parts and the margin). Lines count when their order is confirmed or later and
 * they were not cancelled; the fill rate counts every piece (fill-rate.ts gives the rule). The covering indexes of
 * migration 0021 serve these reads. Plain Node.
 */
import { typed } from '../../utils/sql'
import { num, rows, type Span } from './range'
import { addDays, localInstant } from '../orders/zoned-time'

/** Orders that count as sold: paid or on account, whatever happened to them since (cancelled lines are left out). */
export const SOLD_STATUSES = ['confirmed', 'picking', 'part_dispatched', 'dispatched', 'delivered']

const SOLD = `FROM orders o JOIN order_lines l ON l.order_id = o.id
  WHERE o.created_at >= :start AND o.created_at < :end AND o.status IN (:sold)`
const LIVE = `${SOLD} AND l.state <> 'cancelled'`

const params = (span: Span) => ({ start: span.start, end: span.end, sold: SOLD_STATUSES })

export interface GarageBranchSales { organisation_id: number; branch_id: number; orders: number; net: number; counted: number; filled: number }

/**
 * One pass over the range's lines, per requested line (order and line group) then per (garage, branch): net sales
 * and orders with a line not cancelled (every order falls in one garage and branch, so the sums add up to the
 * totals), and the requested lines whose pieces are all finished, at least one sent (`counted`), of which those sent
 * complete from the home branch's shelf or counter without a split at picking (`filled`; fill-rate.ts gives the rule).
 */
export function salesAndFillByGarageBranch(span: Span): Promise<GarageBranchSales[]> {
  return rows<GarageBranchSales>(`SELECT g.organisation_id, g.branch_id, COUNT(DISTINCT CASE WHEN g.live > 0 THEN g.order_id END) AS orders,
      SUM(g.net) AS net, SUM(CASE WHEN g.unfinished = 0 AND g.sent > 0 THEN 1 ELSE 0 END) AS counted,
      SUM(CASE WHEN g.unfinished = 0 AND g.sent > 0 THEN g.filled ELSE 0 END) AS filled
    FROM (
      SELECT l.order_id, MIN(o.organisation_id) AS organisation_id, MIN(o.branch_id) AS branch_id,
        SUM(CASE WHEN l.state <> 'cancelled' THEN 1 ELSE 0 END) AS live,
        SUM(CASE WHEN l.state <> 'cancelled' THEN l.line_net_minor ELSE 0 END) AS net,
        MIN(CASE WHEN l.source IN ('home', 'collect') AND l.state = 'dispatched' AND l.split_from_line_id IS NULL THEN 1 ELSE 0 END) AS filled,
        SUM(CASE WHEN l.state IN ('dispatched', 'cancelled') THEN 0 ELSE 1 END) AS unfinished,
        SUM(CASE WHEN l.state = 'dispatched' THEN 1 ELSE 0 END) AS sent
      ${SOLD} GROUP BY l.order_id, l.line_group) g
    GROUP BY g.organisation_id, g.branch_id`, params(span))
}

/** Net sales and orders per local day of the span (index into `daysOf`), days without sales left out. */
// CROSS JOIN: SQLite then walks the days and finds each day's orders by the index, rather than each order's day
// among the days; PostgreSQL plans it as any join.
export async function salesByDay(span: Span): Promise<Map<number, { net: number; orders: number }>> {
  const p: Record<string, unknown> = params(span)
  const days: string[] = []
  const [y, m, d] = span.from.split('-').map(Number) as [number, number, number]
  for (let i = 0; i < span.days; i++) {
    p[`s${i}`] = localInstant(addDays({ year: y, month: m, day: d }, i), 0, span.timeZone)
    p[`e${i}`] = localInstant(addDays({ year: y, month: m, day: d }, i + 1), 0, span.timeZone)
    days.push(`(${i}, ${typed(`:s${i}`, 'timestamptz')}, ${typed(`:e${i}`, 'timestamptz')})`)
  }
  const found = await rows<{ i: number; orders: number; net: number }>(`WITH d (i, s, e) AS (VALUES ${days.join(', ')})
    SELECT d.i, COUNT(DISTINCT o.id) AS orders, SUM(l.line_net_minor) AS net
    FROM d CROSS JOIN orders o JOIN order_lines l ON l.order_id = o.id
    WHERE o.created_at >= d.s AND o.created_at < d.e AND o.created_at >= :start AND o.created_at < :end AND o.status IN (:sold) AND l.state <> 'cancelled'
    GROUP BY d.i`, p)
  return new Map(found.map((r) => [num(r.i), { net: num(r.net), orders: num(r.orders) }]))
}

export interface PartVersionSales { part_id: number; sku: string; version: number; lines: number; units: number; net: number }

/**
 * Lines, units and net sales per part and the price version active when each order was placed (`versions`: id and
 * activation instant, oldest first; an order placed before the first counts under the first, as before any file).
 */
export function salesByPartVersion(span: Span, versions: readonly { id: number; at: Date }[]): Promise<PartVersionSales[]> {
  const p: Record<string, unknown> = params(span)
  let version = String(versions[0]?.id ?? 0)
  if (versions.length > 1) {
    const whens = versions.slice(1).map((v, i) => { p[`v${i}`] = v.at; return `WHEN o.created_at >= :v${i} THEN ${Number(v.id)}` }).reverse()
    version = `CASE ${whens.join(' ')} ELSE ${Number(versions[0]!.id)} END`
  }
  return rows<PartVersionSales>(`SELECT l.part_id, l.sku, ${version} AS version, COUNT(*) AS lines, SUM(l.quantity) AS units, SUM(l.line_net_minor) AS net
    ${LIVE} GROUP BY 1, 2, 3`, p)
}

/** The description each of these parts was sold under in the range (the first in text order when it changed). */
export async function soldDescriptions(span: Span, partIds: readonly number[]): Promise<Map<string, string>> {
  if (!partIds.length) return new Map()
  const found = await rows<{ sku: string; description: string }>(`SELECT l.sku, MIN(l.description) AS description ${LIVE} AND l.part_id IN (:partIds)
    GROUP BY l.sku`, { ...params(span), partIds })
  return new Map(found.map((r) => [r.sku, r.description]))
}

/** Back-ordered lines not yet sent nor cancelled, of orders confirmed or later: open now, whatever the range. */
export async function openBackOrders(): Promise<{ lines: number; units: number }> {
  const [r] = await rows<{ n: number; u: number }>(`SELECT COUNT(*) AS n, SUM(l.quantity) AS u FROM order_lines l JOIN orders o ON o.id = l.order_id
    WHERE l.source = 'back_order' AND l.state NOT IN ('dispatched', 'cancelled') AND o.status IN (:sold)`, { sold: SOLD_STATUSES })
  return { lines: num(r?.n), units: num(r?.u) }
}
