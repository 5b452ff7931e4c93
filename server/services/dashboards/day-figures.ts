/**
 * The distributor's sold figures summed per local day and kept in `trade_day_figures` (migration 0024), so a year's
 * dashboard reads 365 kept days and sums again only the days written since, instead of a year of order lines.
 *
 * A day's figures: per garage and branch the net sales, orders and requested lines by fill state, per SKU the units
 * and net (and a part sold under it, whose description the top parts show: sold-figures.ts), the margin's sums against the
 * trade cost of the price version active when each order was placed, and the returns by reason. Every figure is a
 * sum, so a range's figures are the days' figures added together.
 *
 * Whether a kept day is still right: triggers count every write to an order, its lines (the hour of the order) and
 * returns (their own hour) per UTC hour in `trade_day_marks`; counters only grow, so the sum of a day's hours (its
 * `stamp`) grows with any write that touches it. The margin also depends on the part prices and the versions'
 * activations (`context`). The marks are read before the lines, so a write landing meanwhile leaves the kept stamp
 * behind and the day is summed again next time: a kept day is never newer than the rows it came from. Days are kept
 * in this process too (parsed), so an unchanged day costs a comparison. Plain Node.
 */
import { createHash } from 'node:crypto'
import { getDb, withWrite } from '../../utils/db'
import { typed } from '../../utils/sql'
import { addDays, localDate, localInstant } from '../orders/zoned-time'
import { dateText, daysOf, instantOf, num, parts, rows, spanOf, type Span } from './range'
import { merged, rangeOf, totalOf, type DayFigures, type RangeFigures, type SkuSums } from './day-sums'
import { SOLD_STATUSES } from './sold-figures'

export type { DayFigures, RangeFigures } from './day-sums'

/** The UTC hour of an instant as the triggers write it: `YYYY-MM-DD HH`. */
export const hourOf = (t: number): string => new Date(t).toISOString().slice(0, 13).replace('T', ' ')

/** The UTC hours a local day [start, end) touches. */
function hoursOf(start: number, end: number): string[] {
  const out: string[] = []
  for (let t = Math.floor(start / 3_600_000) * 3_600_000; t < end; t += 3_600_000) out.push(hourOf(t))
  return out
}

interface Day { day: string; start: Date; end: Date; stamp: number }

/** Parsed days kept in this process, by time zone and day, with the stamp and context they were summed at. */
const parsed = new Map<string, { stamp: number; context: string; figures: DayFigures }>()
const PARSED_MAX = 4_000

/** What the margin of a kept day depends on besides its lines: the part prices and the price versions' activations. */
async function contextNow(versions: readonly { id: number; at: Date }[]): Promise<string> {
  const [rev] = await rows<{ prices: number }>('SELECT prices FROM catalogue_revisions WHERE id = 1', {})
  const h = createHash('sha1').update(JSON.stringify([num(rev?.prices), versions.map((v) => [v.id, v.at.getTime()])]))
  return h.digest('hex')
}

/** The version active at an order's placing as SQL (an order before the first counts under the first). */
function versionAt(versions: readonly { id: number; at: Date }[], p: Record<string, unknown>): string {
  if (versions.length <= 1) return String(Number(versions[0]?.id ?? 0))
  const whens = versions.slice(1).map((v, i) => { p[`v${i}`] = v.at; return `WHEN o.created_at >= :v${i} THEN ${Number(v.id)}` }).reverse()
  return `CASE ${whens.join(' ')} ELSE ${Number(versions[0]!.id)} END`
}

/** Sums these days afresh from the order lines and returns, in three grouped reads. */
async function sumDays(days: readonly Day[], versions: readonly { id: number; at: Date }[]): Promise<DayFigures[]> {
  const p: Record<string, unknown> = { sold: SOLD_STATUSES }
  const values = days.map((d, i) => {
    p[`s${i}`] = d.start
    p[`e${i}`] = d.end
    return `(${i}, ${typed(`:s${i}`, 'timestamptz')}, ${typed(`:e${i}`, 'timestamptz')})`
  })
  // CROSS JOIN: SQLite walks the days and finds each day's orders by the index (orders_sold_by_day)
  const from = `WITH d (i, s, e) AS (VALUES ${values.join(', ')})`
  const sold = `FROM d CROSS JOIN orders o JOIN order_lines l ON l.order_id = o.id
    WHERE o.created_at >= d.s AND o.created_at < d.e AND o.status IN (:sold)`
  const version = versionAt(versions, p)
  const [garages, skus, returns] = await Promise.all([
    // per requested line (order and line group), then per garage and branch: as salesAndFillByGarageBranch
    rows<{ i: number; organisation_id: number; branch_id: number; orders: number; net: number; counted: number; filled: number }>(`${from}
      SELECT g.i, g.organisation_id, g.branch_id, COUNT(DISTINCT CASE WHEN g.live > 0 THEN g.order_id END) AS orders,
        SUM(g.net) AS net, SUM(CASE WHEN g.unfinished = 0 AND g.sent > 0 THEN 1 ELSE 0 END) AS counted,
        SUM(CASE WHEN g.unfinished = 0 AND g.sent > 0 THEN g.filled ELSE 0 END) AS filled
      FROM (
        SELECT d.i, l.order_id, MIN(o.organisation_id) AS organisation_id, MIN(o.branch_id) AS branch_id,
          SUM(CASE WHEN l.state <> 'cancelled' THEN 1 ELSE 0 END) AS live,
          SUM(CASE WHEN l.state <> 'cancelled' THEN l.line_net_minor ELSE 0 END) AS net,
          MIN(CASE WHEN l.source IN ('home', 'collect') AND l.state = 'dispatched' AND l.split_from_line_id IS NULL THEN 1 ELSE 0 END) AS filled,
          SUM(CASE WHEN l.state IN ('dispatched', 'cancelled') THEN 0 ELSE 1 END) AS unfinished,
          SUM(CASE WHEN l.state = 'dispatched' THEN 1 ELSE 0 END) AS sent
        ${sold} GROUP BY d.i, l.order_id, l.line_group) g
      GROUP BY g.i, g.organisation_id, g.branch_id`, p),
    // per SKU and the price version active at the order, with that version's trade cost of the part (the price row
    // the version set, if it is still the part's: part_prices keeps one row per part)
    rows<{ i: number; sku: string; part_id: number; lines: number; units: number; net: number; unit_cost: number | null }>(`${from}
      SELECT d.i, l.sku, l.part_id, COUNT(*) AS lines, SUM(l.quantity) AS units, SUM(l.line_net_minor) AS net,
        MAX(pp.trade_cost_minor) AS unit_cost
      ${sold.replace('WHERE', `LEFT JOIN part_prices pp ON pp.part_id = l.part_id AND pp.price_version_id = ${version} WHERE`)} AND l.state <> 'cancelled'
      GROUP BY d.i, l.part_id, l.sku, ${version}`, p),
    rows<{ i: number; reason: string; n: number; u: number }>(`${from}
      SELECT d.i, r.reason, COUNT(*) AS n, SUM(r.quantity) AS u FROM d CROSS JOIN part_returns r
      WHERE r.created_at >= d.s AND r.created_at < d.e GROUP BY d.i, r.reason`, p),
  ])
  const out: DayFigures[] = days.map(() => ({ g: [], p: [], m: [0, 0, 0], r: [] }))
  for (const g of garages) {
    out[num(g.i)]!.g.push([num(g.organisation_id), num(g.branch_id), num(g.orders), num(g.net), num(g.counted), num(g.filled)])
  }
  const skuOf = days.map(() => new Map<string, SkuSums>())
  for (const s of skus) {
    const day = out[num(s.i)]!
    if (s.unit_cost === null) day.m[2] += num(s.lines)
    else { day.m[0] += num(s.net); day.m[1] += num(s.unit_cost) * num(s.units) }
    const by = skuOf[num(s.i)]!
    const had = by.get(s.sku)
    if (!had) by.set(s.sku, [s.sku, num(s.part_id), num(s.units), num(s.net)])
    else { had[2] += num(s.units); had[3] += num(s.net) }
  }
  skuOf.forEach((by, i) => { out[i]!.p = [...by.values()] })
  for (const r of returns) out[num(r.i)]!.r.push([r.reason, num(r.n), num(r.u)])
  return out
}

/** A kept period: a local day (`YYYY-MM-DD`) or a whole past month of them (`YYYY-MM`), with its stamp now. */
interface Period { key: string; stamp: number }

/** The revision counters of the span's hours, added up per day (`stamp`), and the kept stamps of these periods. */
async function stampsOf(span: Span, days: Day[], periods: readonly string[]): Promise<Map<string, { stamp: number; context: string }>> {
  const marks = new Map((await rows<{ hour: string; revision: number }>(
    'SELECT hour, revision FROM trade_day_marks WHERE hour >= :first AND hour <= :last',
    { first: hourOf(span.start.getTime()), last: hourOf(span.end.getTime() - 1) },
  )).map((r) => [r.hour, num(r.revision)]))
  for (const d of days) d.stamp = hoursOf(d.start.getTime(), d.end.getTime()).reduce((s, h) => s + (marks.get(h) ?? 0), 0)
  return new Map((await rows<{ day: string; stamp: number; context: string }>(
    'SELECT day, stamp, context FROM trade_day_figures WHERE time_zone = :timeZone AND day IN (:periods)',
    { timeZone: span.timeZone, periods },
  )).map((r) => [r.day, { stamp: num(r.stamp), context: r.context }]))
}

/** Keeps these periods' figures (a later writer of the same period wins; a stale stamp is only summed again). */
async function keep(timeZone: string, periods: readonly Period[], figures: readonly DayFigures[], context: string): Promise<void> {
  const pg = getDb().getDialect() === 'postgres'
  const excluded = pg ? 'EXCLUDED' : 'excluded'
  await withWrite(async (t) => {
    for (let k = 0; k < periods.length; k += 100) {
      const replacements: Record<string, unknown> = { timeZone, context }
      const values = periods.slice(k, k + 100).map((d, j) => {
        Object.assign(replacements, { [`d${j}`]: d.key, [`s${j}`]: d.stamp, [`f${j}`]: JSON.stringify(figures[k + j]) })
        return `(:timeZone, :d${j}, :s${j}, :context, :f${j})`
      })
      await getDb().query(`INSERT INTO trade_day_figures (time_zone, day, stamp, context, figures) VALUES ${values.join(', ')}
        ON CONFLICT (time_zone, day) DO UPDATE SET stamp = ${excluded}.stamp, context = ${excluded}.context, figures = ${excluded}.figures`,
      { replacements, transaction: t })
    }
  // no cache holds these rows (the parsed ones are checked against the stamps): the catalogue's and the sessions'
  // kept reads stay, so a background run never makes the requests in flight wait for fresh ones
  }, { cachesUnaffected: true })
}

/**
 * The kept figures of these periods that are still right (same stamp and context): from this process's parsed ones,
 * else read; `undefined` for the rest.
 */
async function keptFigures(timeZone: string, periods: readonly Period[], kept: Map<string, { stamp: number; context: string }>, context: string): Promise<(DayFigures | undefined)[]> {
  const out: (DayFigures | undefined)[] = periods.map(() => undefined)
  const toRead = new Map<string, number>()
  periods.forEach((p, i) => {
    const k = kept.get(p.key)
    if (!k || k.stamp !== p.stamp || k.context !== context) return
    const mine = parsed.get(`${timeZone}|${p.key}`)
    if (mine && mine.stamp === p.stamp && mine.context === context) out[i] = mine.figures
    else toRead.set(p.key, i)
  })
  if (!toRead.size) return out
  for (const r of await rows<{ day: string; stamp: number; context: string; figures: string }>(
    'SELECT day, stamp, context, figures FROM trade_day_figures WHERE time_zone = :timeZone AND day IN (:keys)',
    { timeZone, keys: [...toRead.keys()] },
  )) {
    const i = toRead.get(r.day)!
    // written again since the stamps were read: sum it rather than trust either
    if (num(r.stamp) !== periods[i]!.stamp || r.context !== context) continue
    out[i] = JSON.parse(r.figures) as DayFigures
    remember(timeZone, periods[i]!, context, out[i]!)
  }
  return out
}

/** The whole calendar months of the span, by their days' places in it. */
function monthsOf(days: readonly Day[]): { key: string; first: number; last: number }[] {
  const out: { key: string; first: number; last: number }[] = []
  let i = 0
  while (i < days.length) {
    const key = days[i]!.day.slice(0, 7)
    let j = i
    while (j + 1 < days.length && days[j + 1]!.day.startsWith(key)) j++
    const whole = days[i]!.day.endsWith('-01') && (j + 1 < days.length || addDays(parts(days[j]!.day), 1).day === 1)
    if (whole) out.push({ key, first: i, last: j })
    i = j + 1
  }
  return out
}

/**
 * The span's figures: whole months and single days from what is kept, summing again from the order lines the
 * days written since they were kept (or never kept), and keeping those and the months made of them.
 */
export async function rangeFigures(span: Span, versions: readonly { id: number; at: Date }[]): Promise<RangeFigures> {
  const from = parts(span.from)
  const days: Day[] = daysOf(span).map((day, i) => ({
    day, start: localInstant(addDays(from, i), 0, span.timeZone), end: localInstant(addDays(from, i + 1), 0, span.timeZone), stamp: 0,
  }))
  const months = monthsOf(days)
  const context = await contextNow(versions)
  const kept = await stampsOf(span, days, [...days.map((d) => d.day), ...months.map((m) => m.key)])
  const monthPeriods: Period[] = months.map((m) => ({ key: m.key, stamp: days.slice(m.first, m.last + 1).reduce((s, d) => s + d.stamp, 0) }))
  const monthFigures = await keptFigures(span.timeZone, monthPeriods, kept, context)
  // the days needed one by one: those outside a kept month, and the days of a month to make again
  const inKeptMonth = new Set<number>()
  months.forEach((m, k) => { if (monthFigures[k]) for (let i = m.first; i <= m.last; i++) inKeptMonth.add(i) })
  const needed = days.map((_, i) => i).filter((i) => !inKeptMonth.has(i))
  const dayPeriods = needed.map((i) => ({ key: days[i]!.day, stamp: days[i]!.stamp }))
  const dayFigures = await keptFigures(span.timeZone, dayPeriods, kept, context)
  const toSum = needed.filter((_, k) => !dayFigures[k])
  const figures = new Map<number, DayFigures>(needed.flatMap((i, k) => (dayFigures[k] ? [[i, dayFigures[k]!] as const] : [])))
  if (toSum.length) {
    const stale = toSum.map((i) => days[i]!)
    const summed = await sumDays(stale, versions)
    const periods = stale.map((d) => ({ key: d.day, stamp: d.stamp }))
    await keep(span.timeZone, periods, summed, context)
    toSum.forEach((i, k) => { figures.set(i, summed[k]!); remember(span.timeZone, periods[k]!, context, summed[k]!) })
  }
  // months made again from their days
  const made = months.flatMap((m, k) => (monthFigures[k] ? [] : [k]))
  if (made.length) {
    for (const k of made) monthFigures[k] = merged(Array.from({ length: months[k]!.last - months[k]!.first + 1 }, (_, j) => figures.get(months[k]!.first + j)!))
    await keep(span.timeZone, made.map((k) => monthPeriods[k]!), made.map((k) => monthFigures[k]!), context)
    for (const k of made) remember(span.timeZone, monthPeriods[k]!, context, monthFigures[k]!)
  }
  // in day order: a month's figures at its first day, its days' totals from the month
  const pieces: DayFigures[] = []
  const byDay: { net: number; orders: number }[] = []
  const monthAt = new Map(months.map((m, k) => [m.first, k]))
  for (let i = 0; i < days.length;) {
    const k = monthAt.get(i)
    if (k !== undefined) {
      const f = monthFigures[k]!
      pieces.push(f)
      for (const [net, orders] of f.d ?? []) byDay.push({ net, orders })
      i = months[k]!.last + 1
      continue
    }
    const f = figures.get(i)!
    pieces.push(f)
    byDay.push(totalOf(f))
    i++
  }
  return { ...rangeOf(merged(pieces)), byDay, summed: toSum.length }
}

function remember(timeZone: string, period: Period, context: string, figures: DayFigures): void {
  const key = `${timeZone}|${period.key}`
  parsed.delete(key)
  parsed.set(key, { stamp: period.stamp, context, figures })
  for (const old of parsed.keys()) {
    if (parsed.size <= PARSED_MAX) break
    parsed.delete(old)
  }
}

/**
 * Sums again, in the background, the days of the last `days` up to today that were written since they were kept (a
 * price file or a time-zone change makes it every day), so the next look at the dashboard finds them kept.
 */
export async function keepRecentDays(now: Date, timeZone: string, days = 400): Promise<number> {
  const to = localDate(now, timeZone)
  const span = spanOf({ from: dateText(addDays(parts(to), 1 - days)), to }, { now, timeZone })
  return (await rangeFigures(span, await priceActivations())).summed
}

/** Price versions by activation (oldest first): the one active when an order was placed prices its cost. */
export async function priceActivations(): Promise<{ id: number; at: Date }[]> {
  return (await rows<{ id: number; activated_at: string | Date }>('SELECT id, activated_at FROM price_versions WHERE activated_at IS NOT NULL ORDER BY activated_at, id', {}))
    .map((v) => ({ id: num(v.id), at: new Date(instantOf(v.activated_at)) }))
}

/** Forgets the days parsed in this process (the benchmark's runs that read the kept rows). */
export function forgetParsedDays(): void {
  parsed.clear()
}
