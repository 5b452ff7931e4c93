/**
 * The sums of the distributor's sold figures for one period (a local day or a whole month of them), as kept in
 * `trade_day_figures`, and how periods add up into a range's figures (day-figures.ts keeps and reads them). Every
 * figure is a sum, so adding periods is adding their sums. Plain TypeScript.
 */

/** One garage and branch's sums: [organisation, branch, orders, net, requested lines counted, of them filled]. */
export type GarageBranchSums = [number, number, number, number, number, number]
/** One SKU's sums: [sku, part, units, net] (the part is the first sold under the SKU that day, for its description). */
export type SkuSums = [string, number, number, number]

export interface DayFigures {
  g: GarageBranchSums[]
  p: SkuSums[]
  /** [net of lines with a known cost, their cost, lines without a cost] */
  m: [number, number, number]
  /** returns by reason: [reason, returns, units] */
  r: [string, number, number][]
  /** a month's: each of its days' [net, orders], in order */
  d?: [number, number][]
}

export interface RangeFigures {
  byGarageBranch: Map<number, { organisationId: number; branchId: number; orders: number; net: number; counted: number; filled: number }>
  /** per day of the span (index into `daysOf`) */
  byDay: { net: number; orders: number }[]
  bySku: Map<string, { sku: string; partId: number; units: number; net: number }>
  margin: { netMinor: number; costMinor: number; linesWithoutCost: number }
  returns: Map<string, { count: number; units: number }>
  /** how many days were summed again from the order lines (the rest were kept) */
  summed: number
}

/** A day's net sales and orders (every order falls in one garage and branch). */
export function totalOf(f: DayFigures): { net: number; orders: number } {
  let net = 0, orders = 0
  for (const g of f.g) { orders += g[2]; net += g[3] }
  return { net, orders }
}

/** Periods' figures added together, in order; the days' totals carried along (`d`) for a month made of days. */
export function merged(list: readonly DayFigures[]): DayFigures {
  const g = new Map<number, GarageBranchSums>()
  const p = new Map<string, SkuSums>()
  const r = new Map<string, [string, number, number]>()
  const out: DayFigures = { g: [], p: [], m: [0, 0, 0], r: [], d: [] }
  for (const f of list) {
    for (const x of f.g) {
      const key = x[0] * 1_000_000 + x[1]
      const had = g.get(key)
      if (!had) g.set(key, [...x])
      else { had[2] += x[2]; had[3] += x[3]; had[4] += x[4]; had[5] += x[5] }
    }
    for (const x of f.p) {
      const had = p.get(x[0])
      if (!had) p.set(x[0], [...x])
      else { had[2] += x[2]; had[3] += x[3] }
    }
    for (let k = 0; k < 3; k++) out.m[k]! += f.m[k]!
    for (const x of f.r) {
      const had = r.get(x[0])
      if (!had) r.set(x[0], [...x])
      else { had[1] += x[1]; had[2] += x[2] }
    }
    if (f.d) out.d!.push(...f.d)
    else { const t = totalOf(f); out.d!.push([t.net, t.orders]) }
  }
  out.g = [...g.values()]
  out.p = [...p.values()]
  out.r = [...r.values()]
  return out
}

/** Added figures in the shape the dashboard reads. */
export function rangeOf(f: DayFigures): Omit<RangeFigures, 'byDay' | 'summed'> {
  return {
    byGarageBranch: new Map(f.g.map(([organisationId, branchId, orders, net, counted, filled]) =>
      [organisationId * 1_000_000 + branchId, { organisationId, branchId, orders, net, counted, filled }])),
    bySku: new Map(f.p.map(([sku, partId, units, net]) => [sku, { sku, partId, units, net }])),
    margin: { netMinor: f.m[0], costMinor: f.m[1], linesWithoutCost: f.m[2] },
    returns: new Map(f.r.map(([reason, count, units]) => [reason, { count, units }])),
  }
}
