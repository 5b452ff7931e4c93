/**
 * Wall-clock time in the installation's one time zone (runtime config `public.timeZone`), with Intl only: the
 * local day, weekday and minute of an instant, and the instant a local day and minute fall on (daylight-saving
 * changes included). Delivery runs, counter hours and cut-offs are local times; everything stored is an instant.
 * Plain Node.
 */

export interface LocalDay { year: number; month: number; day: number }
export interface LocalParts extends LocalDay {
  /** minutes after local midnight */
  minute: number
  /** ISO weekday: 1 Monday ... 7 Sunday */
  weekday: number
}

const partsFormats = new Map<string, Intl.DateTimeFormat>()
function partsFormat(timeZone: string): Intl.DateTimeFormat {
  let f = partsFormats.get(timeZone)
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', {
      timeZone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric',
    })
    partsFormats.set(timeZone, f)
  }
  return f
}

function fields(at: Date, timeZone: string): Record<string, number> {
  const out: Record<string, number> = {}
  for (const p of partsFormat(timeZone).formatToParts(at)) if (p.type !== 'literal') out[p.type] = Number(p.value)
  return out
}

/** The zone's offset from UTC at `at`, in milliseconds (positive east of Greenwich). */
function offsetAt(at: Date, timeZone: string): number {
  const f = fields(at, timeZone)
  const asUtc = Date.UTC(f.year!, f.month! - 1, f.day!, f.hour!, f.minute!, f.second!)
  return asUtc - Math.floor(at.getTime() / 1000) * 1000
}

export function localParts(at: Date, timeZone: string): LocalParts {
  const f = fields(at, timeZone)
  const weekday = new Date(Date.UTC(f.year!, f.month! - 1, f.day!)).getUTCDay() || 7
  return { year: f.year!, month: f.month!, day: f.day!, minute: f.hour! * 60 + f.minute!, weekday }
}

/** The instant the local clock shows `minute` on `day` (in a skipped hour: the same wall time after the change). */
export function localInstant(day: LocalDay, minute: number, timeZone: string): Date {
  const wall = Date.UTC(day.year, day.month - 1, day.day, 0, minute)
  let t = wall - offsetAt(new Date(wall), timeZone)
  t = wall - offsetAt(new Date(t), timeZone)
  return new Date(t)
}

/** The local day `n` days after `day`. */
export function addDays(day: LocalDay, n: number): LocalDay {
  const d = new Date(Date.UTC(day.year, day.month - 1, day.day + n))
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() }
}

export function weekdayOf(day: LocalDay): number {
  return new Date(Date.UTC(day.year, day.month - 1, day.day)).getUTCDay() || 7
}

/** "2026-12-03": the local calendar day of an instant. */
export function localDate(at: Date, timeZone: string): string {
  const p = localParts(at, timeZone)
  return `${p.year}-${String(p.month).padStart(2, '0')}-${String(p.day).padStart(2, '0')}`
}

/** Whole local days from `from`'s day to `to`'s day (0 on the same day). */
export function daysBetween(from: Date, to: Date, timeZone: string): number {
  const a = localParts(from, timeZone)
  const b = localParts(to, timeZone)
  return Math.round((Date.UTC(b.year, b.month - 1, b.day) - Date.UTC(a.year, a.month - 1, a.day)) / 86_400_000)
}

/** "14:30" for minutes after midnight. */
export function clockText(minute: number): string {
  return `${String(Math.floor(minute / 60)).padStart(2, '0')}:${String(minute % 60).padStart(2, '0')}`
}
