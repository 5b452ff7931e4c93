/**
 * The distributor's dashboard over a range of local days: sales by day and by branch (net of VAT, parts only,
 * lines not cancelled, orders confirmed or later), gross margin against trade cost, first-time fill rate
 * (fill-rate.ts), back-orders open now, returns by reason, the top parts and garages, what garages owe by ageing
 * bucket, and the effect of the last price file. Plain selects with the range as parameters; grouping in JS.
 */
import { Branch, Organisation } from '../../models/accounts'
import { PriceVersion } from '../../models/catalogue'
import { RETURN_REASON_LABELS, type ReturnReason } from '../../../shared/types/returns'
import { DASHBOARD_TOP_N, type DistributorDashboard } from '../../../shared/types/dashboards'
import type { LineState, SupplySource } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import type { ViewClock } from '../orders/clock'
import { fillRateOf } from './fill-rate'
import { overdueOfAll } from './overdue-all'
import { lastPriceFileEffect } from './price-effect'
import { dayIndexer, daysOf, num, rateBp, rows, type Span } from './range'

/** Orders that count as sold: paid or on account, whatever happened to them since (cancelled lines are left out). */
export const SOLD_STATUSES = ['confirmed', 'picking', 'part_dispatched', 'dispatched', 'delivered']

interface SoldLine {
  order_id: number; organisation_id: number; branch_id: number; created_at: string | Date; part_id: number; sku: string; description: string
  quantity: number; line_net_minor: number; source: SupplySource; state: LineState; line_group: number; split_from_line_id: number | null
}

const SOLD_LINES = `SELECT l.order_id, o.organisation_id, o.branch_id, o.created_at, l.part_id, l.sku, l.description, l.quantity, l.line_net_minor,
  l.source, l.state, l.line_group, l.split_from_line_id
  FROM order_lines l JOIN orders o ON o.id = l.order_id
  WHERE o.created_at >= :start AND o.created_at < :end AND o.status IN (:sold)`

function top<T>(m: Map<string | number, T>, by: (t: T) => number): T[] {
  return [...m.values()].sort((a, b) => by(b) - by(a)).slice(0, DASHBOARD_TOP_N)
}

/** Trade cost per unit of each (price version, part): the version active when each order was placed. */
async function costs(lines: readonly SoldLine[]): Promise<(l: SoldLine) => number | null> {
  const versions = (await PriceVersion.findAll({ attributes: ['id', 'activatedAt'], order: [['activatedAt', 'ASC'], ['id', 'ASC']] }))
    .filter((v) => v.activatedAt).map((v) => ({ id: v.id, at: v.activatedAt!.getTime() }))
  const versionAt = (at: number) => versions.filter((v) => v.at <= at).at(-1)?.id ?? versions[0]?.id ?? 0
  // one version per order, worked out once
  const byOrder = new Map<number, number>()
  const versionOf = (l: SoldLine) => {
    let v = byOrder.get(num(l.order_id))
    if (v === undefined) { v = versionAt(new Date(l.created_at).getTime()); byOrder.set(num(l.order_id), v) }
    return v
  }
  const used = [...new Set(lines.map(versionOf))]
  const cost = new Map<string, number | null>()
  if (used.length) {
    for (const r of await rows<{ price_version_id: number; part_id: number; trade_cost_minor: number | null }>(
      'SELECT price_version_id, part_id, trade_cost_minor FROM part_prices WHERE price_version_id IN (:used)', { used },
    )) cost.set(`${num(r.price_version_id)}:${num(r.part_id)}`, r.trade_cost_minor === null ? null : num(r.trade_cost_minor))
  }
  return (l) => cost.get(`${versionOf(l)}:${num(l.part_id)}`) ?? null
}

export async function distributorDashboard(span: Span, clock: ViewClock, fmt: Formats): Promise<DistributorDashboard> {
  const range = { start: span.start, end: span.end }
  const [lines, backOrders, returns, branches, overdue, lastPriceFile] = await Promise.all([
    rows<SoldLine>(SOLD_LINES, { ...range, sold: SOLD_STATUSES }),
    rows<{ n: number; u: number }>(`SELECT COUNT(*) AS n, SUM(l.quantity) AS u FROM order_lines l JOIN orders o ON o.id = l.order_id
      WHERE l.source = 'back_order' AND l.state NOT IN ('dispatched', 'cancelled') AND o.status IN (:sold)`, { sold: SOLD_STATUSES }),
    rows<{ reason: ReturnReason; n: number; u: number }>('SELECT reason, COUNT(*) AS n, SUM(quantity) AS u FROM part_returns WHERE created_at >= :start AND created_at < :end GROUP BY reason', range),
    Branch.findAll({ attributes: ['id', 'name'] }),
    overdueOfAll(clock),
    lastPriceFileEffect(clock.timeZone),
  ])
  const live = lines.filter((l) => l.state !== 'cancelled')
  const costOf = await costs(live)
  const byDay = daysOf(span).map((day) => ({ day, netMinor: 0, orders: new Set<number>() }))
  const dayOf = dayIndexer(span)
  const byBranch = new Map<number, { branch: string; netMinor: number; orders: Set<number> }>()
  const parts = new Map<string, { sku: string; description: string; units: number; netMinor: number }>()
  const garages = new Map<number, { id: number; netMinor: number; orders: Set<number> }>()
  const margin = { netMinor: 0, costMinor: 0, linesWithoutCost: 0 }
  const branchName = new Map(branches.map((b) => [b.id, b.name]))
  for (const l of live) {
    const net = num(l.line_net_minor), qty = num(l.quantity), orderId = num(l.order_id)
    const d = byDay[dayOf(l.created_at)]
    if (d) { d.netMinor += net; d.orders.add(orderId) }
    const b = byBranch.get(num(l.branch_id)) ?? { branch: branchName.get(num(l.branch_id)) ?? '', netMinor: 0, orders: new Set<number>() }
    b.netMinor += net; b.orders.add(orderId); byBranch.set(num(l.branch_id), b)
    const p = parts.get(l.sku) ?? { sku: l.sku, description: l.description, units: 0, netMinor: 0 }
    p.units += qty; p.netMinor += net; parts.set(l.sku, p)
    const g = garages.get(num(l.organisation_id)) ?? { id: num(l.organisation_id), netMinor: 0, orders: new Set<number>() }
    g.netMinor += net; g.orders.add(orderId); garages.set(g.id, g)
    const unitCost = costOf(l)
    if (unitCost === null) margin.linesWithoutCost++
    else { margin.netMinor += net; margin.costMinor += unitCost * qty }
  }
  const topGarages = top(garages, (g) => g.netMinor)
  const names = new Map((await Organisation.findAll({ where: { id: topGarages.map((g) => g.id) }, attributes: ['id', 'name'] })).map((o) => [o.id, o.name]))
  const fill = fillRateOf(lines.map((l) => ({ orderId: num(l.order_id), lineGroup: num(l.line_group), source: l.source, state: l.state, splitFromLineId: l.split_from_line_id === null ? null : num(l.split_from_line_id) })))
  const orderCount = new Set(live.map((l) => num(l.order_id))).size
  return {
    range: { from: span.from, to: span.to, days: span.days, timeZone: span.timeZone },
    currency: fmt.currency,
    sales: {
      netMinor: live.reduce((s, l) => s + num(l.line_net_minor), 0), orders: orderCount,
      byDay: byDay.map((d) => ({ day: d.day, netMinor: d.netMinor, orders: d.orders.size })),
      byBranch: [...byBranch.values()].sort((a, b) => b.netMinor - a.netMinor).map((b) => ({ branch: b.branch, netMinor: b.netMinor, orders: b.orders.size })),
    },
    margin: { ...margin, marginMinor: margin.netMinor - margin.costMinor, marginBp: rateBp(margin.netMinor - margin.costMinor, margin.netMinor) },
    fillRate: { ...fill, rateBp: rateBp(fill.filled, fill.lines) },
    backOrders: { lines: num(backOrders[0]?.n), units: num(backOrders[0]?.u) },
    returnsByReason: returns.map((r) => ({ key: r.reason, label: RETURN_REASON_LABELS[r.reason] ?? r.reason, count: num(r.n), units: num(r.u) })).sort((a, b) => b.count - a.count),
    topParts: top(parts, (p) => p.netMinor),
    topGarages: topGarages.map((g) => ({ id: g.id, name: names.get(g.id) ?? '', orders: g.orders.size, netMinor: g.netMinor })),
    overdue,
    lastPriceFile,
  }
}
