/**
 * A dashboard's range: local days in the one configured time zone, both included (the last 30 days unless asked),
 * as the instants they begin and end, passed to queries as parameters (no date functions in SQL). Plain Node.
 */
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import type { DashboardQuery } from '../../../shared/schemas/dashboards'
import type { DashboardRange } from '../../../shared/types/dashboards'
import type { ViewClock } from '../orders/clock'
import { addDays, localDate, localInstant } from '../orders/zoned-time'

export interface Span extends DashboardRange { start: Date; end: Date }

/** A `YYYY-MM-DD` date as its parts. */
export const parts = (d: string) => {
  const [year, month, day] = d.split('-').map(Number) as [number, number, number]
  return { year, month, day }
}
/** A date's parts as `YYYY-MM-DD`. */
export const dateText = (p: { year: number; month: number; day: number }) => `${p.year}-${String(p.month).padStart(2, '0')}-${String(p.day).padStart(2, '0')}`

export function spanOf(q: DashboardQuery, clock: ViewClock): Span {
  const to = q.to ?? (q.from ? dateText(addDays(parts(q.from), 29)) : localDate(clock.now, clock.timeZone))
  const from = q.from ?? dateText(addDays(parts(to), -29))
  const days = Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000) + 1
  return {
    from, to, days, timeZone: clock.timeZone,
    start: localInstant(parts(from), 0, clock.timeZone), end: localInstant(addDays(parts(to), 1), 0, clock.timeZone),
  }
}

/** Every local day of the span, in order. */
export function daysOf(span: Span): string[] {
  return Array.from({ length: span.days }, (_, i) => dateText(addDays(parts(span.from), i)))
}

/**
 * Which day of the span an instant falls on (its index in `daysOf`), or -1 outside it: the days' first instants are
 * worked out once, so a year of rows costs a binary search each rather than a time-zone conversion each.
 */
export function dayIndexer(span: Span): (at: Date | string) => number {
  const starts = Array.from({ length: span.days + 1 }, (_, i) => localInstant(addDays(parts(span.from), i), 0, span.timeZone).getTime())
  return (at) => {
    const t = instantOf(at)
    if (!(t >= starts[0]! && t < starts[span.days]!)) return -1
    let lo = 0, hi = span.days - 1
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1
      if (starts[mid]! <= t) lo = mid
      else hi = mid - 1
    }
    return lo
  }
}

/** A read-only query with named parameters; numbers from SUM/COUNT come back as numbers on every database. */
export async function rows<T extends object>(sql: string, replacements: Record<string, unknown>): Promise<T[]> {
  return getDb().query<T>(sql, { replacements, type: QueryTypes.SELECT })
}

export const num = (v: unknown): number => Number(v ?? 0) || 0

/** a / b in basis points, rounded half up; null when b is 0. */
export const rateBp = (a: number, b: number): number | null => (b > 0 ? Math.round((a * 10_000) / b) : null)

/** An instant as the database driver hands it back: a Date, or SQLite's text `YYYY-MM-DD HH:MM:SS.sss +00:00`. */
export const instantOf = (at: Date | string): number => (typeof at === 'string' ? Date.parse(at.replace(' ', 'T').replace(' +', '+')) : at.getTime())
