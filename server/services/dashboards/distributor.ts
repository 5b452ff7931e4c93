/**
 * The distributor's dashboard over a range of local days: sales by day and by branch (net of VAT, parts only,
 * lines not cancelled, orders confirmed or later), gross margin against trade cost, first-time fill rate, back-orders
 * open now, returns by reason, the top parts and garages, what garages owe by ageing bucket (open-items.ts), and the
 * effect of the last price file. The sold figures are summed per local day in the database and kept
 * (day-figures.ts): a range adds up its kept days and sums again only the days written since. A finished answer is
 * also kept whole (answer-cache.ts) until anything it reads is written or the day changes. Plain Node.
 */
import { Branch, Organisation } from '../../models/accounts'
import { RETURN_REASON_LABELS, type ReturnReason } from '../../../shared/types/returns'
import { DASHBOARD_TOP_N, type DistributorDashboard } from '../../../shared/types/dashboards'
import type { Formats } from '../../../shared/utils/format'
import type { ViewClock } from '../orders/clock'
import { cachedAnswer } from './answer-cache'
import { overdueOfAll } from './open-items'
import { lastPriceFileEffect } from './price-effect'
import { priceActivations, rangeFigures } from './day-figures'
import { daysOf, rateBp, type Span } from './range'
import { openBackOrders, soldDescriptions } from './sold-figures'

export { SOLD_STATUSES } from './sold-figures'

function top<T>(list: Iterable<T>, by: (t: T) => number): T[] {
  return [...list].sort((a, b) => by(b) - by(a)).slice(0, DASHBOARD_TOP_N)
}

/** The dashboard worked out from the kept day figures (day-figures.ts) and what is open now, no kept answer. */
export async function freshDistributorDashboard(span: Span, clock: ViewClock, fmt: Formats): Promise<DistributorDashboard> {
  const versions = await priceActivations()
  const [figures, backOrders, branches, overdue, lastPriceFile] = await Promise.all([
    rangeFigures(span, versions),
    openBackOrders(),
    Branch.findAll({ attributes: ['id', 'name'] }),
    overdueOfAll(clock),
    lastPriceFileEffect(clock.timeZone),
  ])
  const branchName = new Map(branches.map((b) => [b.id, b.name]))
  const byBranch = new Map<number, { id: number; netMinor: number; orders: number }>()
  const byGarage = new Map<number, { id: number; netMinor: number; orders: number }>()
  const add = (m: Map<number, { id: number; netMinor: number; orders: number }>, id: number, s: { net: number; orders: number }) => {
    const had = m.get(id) ?? { id, netMinor: 0, orders: 0 }
    m.set(id, { id, netMinor: had.netMinor + s.net, orders: had.orders + s.orders })
  }
  const fill = { lines: 0, filled: 0 }
  let netMinor = 0, orders = 0
  for (const s of figures.byGarageBranch.values()) {
    fill.lines += s.counted
    fill.filled += s.filled
    netMinor += s.net
    orders += s.orders
    if (!s.orders) continue // only cancelled lines: nothing sold
    add(byBranch, s.branchId, s)
    add(byGarage, s.organisationId, s)
  }
  const topGarages = top(byGarage.values(), (g) => g.netMinor)
  const topParts = top(figures.bySku.values(), (p) => p.net)
  const [names, descriptions] = await Promise.all([
    Organisation.findAll({ where: { id: topGarages.map((g) => g.id) }, attributes: ['id', 'name'] }),
    soldDescriptions(span, topParts),
  ])
  const nameOf = new Map(names.map((o) => [o.id, o.name]))
  const margin = figures.margin
  return {
    range: { from: span.from, to: span.to, days: span.days, timeZone: span.timeZone },
    currency: fmt.currency,
    sales: {
      netMinor, orders,
      byDay: daysOf(span).map((day, i) => ({ day, netMinor: figures.byDay[i]?.net ?? 0, orders: figures.byDay[i]?.orders ?? 0 })),
      byBranch: [...byBranch.values()].sort((a, b) => b.netMinor - a.netMinor).map((b) => ({ branch: branchName.get(b.id) ?? '', netMinor: b.netMinor, orders: b.orders })),
    },
    margin: { ...margin, marginMinor: margin.netMinor - margin.costMinor, marginBp: rateBp(margin.netMinor - margin.costMinor, margin.netMinor) },
    fillRate: { ...fill, rateBp: rateBp(fill.filled, fill.lines) },
    backOrders,
    returnsByReason: [...figures.returns].map(([reason, r]) => ({ key: reason as ReturnReason, label: RETURN_REASON_LABELS[reason as ReturnReason] ?? reason, count: r.count, units: r.units }))
      .sort((a, b) => b.count - a.count),
    topParts: topParts.map((p) => ({ sku: p.sku, description: descriptions.get(p.sku) ?? '', units: p.units, netMinor: p.net })),
    topGarages: topGarages.map((g) => ({ id: g.id, name: nameOf.get(g.id) ?? '', orders: g.orders, netMinor: g.netMinor })),
    overdue,
    lastPriceFile,
  }
}

/** The dashboard: the kept answer while nothing it reads has changed, else worked out afresh (and kept). */
export function distributorDashboard(span: Span, clock: ViewClock, fmt: Formats): Promise<DistributorDashboard> {
  return cachedAnswer(span, clock, fmt, () => freshDistributorDashboard(span, clock, fmt))
}
