/**
 * The distributor's dashboard over a range of local days: sales by day and by branch (net of VAT, parts only,
 * lines not cancelled, orders confirmed or later), gross margin against trade cost, first-time fill rate, back-orders
 * open now, returns by reason, the top parts and garages, what garages owe by ageing bucket (open-items.ts), and the
 * effect of the last price file. Summed in the database (sold-figures.ts); JS only puts the groups together. A
 * finished answer is kept (answer-cache.ts) until anything it reads is written or the day changes. Plain Node.
 */
import { Branch, Organisation } from '../../models/accounts'
import { PriceVersion } from '../../models/catalogue'
import { RETURN_REASON_LABELS, type ReturnReason } from '../../../shared/types/returns'
import { DASHBOARD_TOP_N, type DistributorDashboard } from '../../../shared/types/dashboards'
import type { Formats } from '../../../shared/utils/format'
import type { ViewClock } from '../orders/clock'
import { cachedAnswer } from './answer-cache'
import { overdueOfAll } from './open-items'
import { lastPriceFileEffect } from './price-effect'
import { daysOf, num, rateBp, rows, type Span } from './range'
import { openBackOrders, salesAndFillByGarageBranch, salesByDay, salesByPartVersion, soldDescriptions, type PartVersionSales } from './sold-figures'

export { SOLD_STATUSES } from './sold-figures'

function top<T>(list: Iterable<T>, by: (t: T) => number): T[] {
  return [...list].sort((a, b) => by(b) - by(a)).slice(0, DASHBOARD_TOP_N)
}

/** Sum of `value` per key, in first-seen order. */
function summed<T, K>(list: readonly T[], key: (t: T) => K, add: (into: T | undefined, t: T) => T): Map<K, T> {
  const m = new Map<K, T>()
  for (const t of list) m.set(key(t), add(m.get(key(t)), t))
  return m
}

/** Price versions by activation (oldest first): the one active when an order was placed prices its cost. */
async function activations(): Promise<{ id: number; at: Date }[]> {
  return (await PriceVersion.findAll({ attributes: ['id', 'activatedAt'], order: [['activatedAt', 'ASC'], ['id', 'ASC']] }))
    .filter((v) => v.activatedAt).map((v) => ({ id: v.id, at: v.activatedAt! }))
}

/** Margin against the trade cost of each part in the version active at the order; parts without a cost counted aside. */
async function marginOf(groups: readonly PartVersionSales[]): Promise<Omit<DistributorDashboard['margin'], 'marginMinor' | 'marginBp'>> {
  const used = [...new Set(groups.map((g) => num(g.version)))]
  const cost = new Map<string, number | null>()
  if (used.length) {
    for (const r of await rows<{ price_version_id: number; part_id: number; trade_cost_minor: number | null }>(
      'SELECT price_version_id, part_id, trade_cost_minor FROM part_prices WHERE price_version_id IN (:used)', { used },
    )) cost.set(`${num(r.price_version_id)}:${num(r.part_id)}`, r.trade_cost_minor === null ? null : num(r.trade_cost_minor))
  }
  const margin = { netMinor: 0, costMinor: 0, linesWithoutCost: 0 }
  for (const g of groups) {
    const unitCost = cost.get(`${num(g.version)}:${num(g.part_id)}`) ?? null
    if (unitCost === null) margin.linesWithoutCost += num(g.lines)
    else { margin.netMinor += num(g.net); margin.costMinor += unitCost * num(g.units) }
  }
  return margin
}

/** The dashboard worked out from the database, no kept answer. */
export async function freshDistributorDashboard(span: Span, clock: ViewClock, fmt: Formats): Promise<DistributorDashboard> {
  const versions = await activations()
  const [sales, byDay, partGroups, backOrders, returns, branches, overdue, lastPriceFile] = await Promise.all([
    salesAndFillByGarageBranch(span),
    salesByDay(span),
    salesByPartVersion(span, versions),
    openBackOrders(),
    rows<{ reason: ReturnReason; n: number; u: number }>('SELECT reason, COUNT(*) AS n, SUM(quantity) AS u FROM part_returns WHERE created_at >= :start AND created_at < :end GROUP BY reason', { start: span.start, end: span.end }),
    Branch.findAll({ attributes: ['id', 'name'] }),
    overdueOfAll(clock),
    lastPriceFileEffect(clock.timeZone),
  ])
  const branchName = new Map(branches.map((b) => [b.id, b.name]))
  const add = (into: { id: number; netMinor: number; orders: number } | undefined, id: number, s: { net: number; orders: number }) =>
    ({ id, netMinor: (into?.netMinor ?? 0) + num(s.net), orders: (into?.orders ?? 0) + num(s.orders) })
  const byBranch = new Map<number, { id: number; netMinor: number; orders: number }>()
  const byGarage = new Map<number, { id: number; netMinor: number; orders: number }>()
  const fill = { lines: 0, filled: 0 }
  for (const s of sales) {
    fill.lines += num(s.counted)
    fill.filled += num(s.filled)
    if (!num(s.orders)) continue // only cancelled lines: nothing sold
    byBranch.set(num(s.branch_id), add(byBranch.get(num(s.branch_id)), num(s.branch_id), s))
    byGarage.set(num(s.organisation_id), add(byGarage.get(num(s.organisation_id)), num(s.organisation_id), s))
  }
  const parts = summed(partGroups, (g) => g.sku, (into, g) => ({ ...g, units: num(into?.units) + num(g.units), net: num(into?.net) + num(g.net) }))
  const topParts = top(parts.values(), (p) => p.net)
  const [descriptions, names] = await Promise.all([
    soldDescriptions(span, topParts.map((p) => num(p.part_id))),
    Organisation.findAll({ where: { id: top(byGarage.values(), (g) => g.netMinor).map((g) => g.id) }, attributes: ['id', 'name'] }),
  ])
  const nameOf = new Map(names.map((o) => [o.id, o.name]))
  const margin = await marginOf(partGroups)
  return {
    range: { from: span.from, to: span.to, days: span.days, timeZone: span.timeZone },
    currency: fmt.currency,
    sales: {
      netMinor: sales.reduce((s, g) => s + num(g.net), 0), orders: sales.reduce((s, g) => s + num(g.orders), 0),
      byDay: daysOf(span).map((day, i) => ({ day, netMinor: byDay.get(i)?.net ?? 0, orders: byDay.get(i)?.orders ?? 0 })),
      byBranch: [...byBranch.values()].sort((a, b) => b.netMinor - a.netMinor).map((b) => ({ branch: branchName.get(b.id) ?? '', netMinor: b.netMinor, orders: b.orders })),
    },
    margin: { ...margin, marginMinor: margin.netMinor - margin.costMinor, marginBp: rateBp(margin.netMinor - margin.costMinor, margin.netMinor) },
    fillRate: { ...fill, rateBp: rateBp(fill.filled, fill.lines) },
    backOrders,
    returnsByReason: returns.map((r) => ({ key: r.reason, label: RETURN_REASON_LABELS[r.reason] ?? r.reason, count: num(r.n), units: num(r.u) })).sort((a, b) => b.count - a.count),
    topParts: topParts.map((p) => ({ sku: p.sku, description: descriptions.get(p.sku) ?? '', units: p.units, netMinor: p.net })),
    topGarages: top(byGarage.values(), (g) => g.netMinor).map((g) => ({ id: g.id, name: nameOf.get(g.id) ?? '', orders: g.orders, netMinor: g.netMinor })),
    overdue,
    lastPriceFile,
  }
}

/** The dashboard: the kept answer while nothing it reads has changed, else worked out afresh (and kept). */
export function distributorDashboard(span: Span, clock: ViewClock, fmt: Formats): Promise<DistributorDashboard> {
  return cachedAnswer(span, clock, fmt, () => freshDistributorDashboard(span, clock, fmt))
}
