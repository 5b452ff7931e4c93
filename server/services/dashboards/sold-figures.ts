/**
 * What counts as sold, and the back-orders open now. Lines count when their order is confirmed or later and they were
 * not cancelled; day-figures.ts sums them per local day (the fill rate over every piece: fill-rate.ts gives the rule).
 * Plain Node.
 */
import { num, rows, type Span } from './range'

/** Orders that count as sold: paid or on account, whatever happened to them since (cancelled lines are left out). */
export const SOLD_STATUSES = ['confirmed', 'picking', 'part_dispatched', 'dispatched', 'delivered']

/** Back-ordered lines not yet sent nor cancelled, of orders confirmed or later: open now, whatever the range. */
export async function openBackOrders(): Promise<{ lines: number; units: number }> {
  const [r] = await rows<{ n: number; u: number }>(`SELECT COUNT(*) AS n, SUM(l.quantity) AS u FROM order_lines l JOIN orders o ON o.id = l.order_id
    WHERE l.source = 'back_order' AND l.state NOT IN ('dispatched', 'cancelled') AND o.status IN (:sold)`, { sold: SOLD_STATUSES })
  return { lines: num(r?.n), units: num(r?.u) }
}

/**
 * The description each of these SKUs was sold under in the span (the least in text order when it changed), found
 * through the lines of the parts sold under them (`order_lines_waiting` starts with the part; CROSS JOIN keeps SQLite
 * from walking the whole range's orders instead, PostgreSQL plans it as any join).
 */
export async function soldDescriptions(span: Span, sold: readonly { sku: string; partId: number }[]): Promise<Map<string, string>> {
  if (!sold.length) return new Map()
  const found = await rows<{ sku: string; description: string }>(`SELECT l.sku, MIN(l.description) AS description
    FROM order_lines l CROSS JOIN orders o
    WHERE o.id = l.order_id AND l.part_id IN (:partIds) AND l.sku IN (:skus) AND l.state <> 'cancelled'
      AND o.created_at >= :start AND o.created_at < :end AND o.status IN (:sold)
    GROUP BY l.sku`, { partIds: [...new Set(sold.map((s) => s.partId))], skus: sold.map((s) => s.sku), start: span.start, end: span.end, sold: SOLD_STATUSES })
  return new Map(found.map((r) => [r.sku, r.description]))
}
