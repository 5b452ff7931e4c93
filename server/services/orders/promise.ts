/**
 * When a part reaches the garage: the first delivery run whose cut-off it makes, or when it can be collected
 * from the counter, and the promise in words. Pure: the branch's schedule, the moment the units are ready at the
 * branch, "now" (injectable: tests move the clock) and the time zone in, instants and words out.
 *
 * Rules:
 * - a run takes what is ready at or before its cut-off (departure less the cut-off minutes); it arrives a typical
 *   transit after it leaves. Runs go on the weekdays they name, in local time.
 * - collection: the counter is open on weekdays between its opening and closing minutes; a part is out on the
 *   counter `collectionMinutes` after it is ready (or after opening, whichever is later), and not after closing.
 * - a back-order reaches the branch at the counter's opening on the supplier's lead day (working days);
 *   a transfer reaches it the source branch's transfer time after the order.
 */
import { addDays, clockText, localInstant, localParts, weekdayOf, type LocalDay } from './zoned-time'

export interface RunTimes { departsMinute: number; cutoffMinutes: number; transitMinutes: number; weekdays: string }

export interface BranchTimes {
  id: number
  code: string
  name: string
  collection: boolean
  counterOpensMinute: number
  counterClosesMinute: number
  collectionMinutes: number
  transferMinutes: number
  runs: RunTimes[]
}

export type When =
  | { kind: 'run'; departsAt: Date; arrivesAt: Date }
  | { kind: 'collect'; arrivesAt: Date }

/** How far ahead to look for a run or an open counter (a branch closed longer than this has no promise). */
const HORIZON_DAYS = 21
const WORKING = (weekday: number) => weekday <= 5

function dayOf(at: Date, timeZone: string): LocalDay {
  const p = localParts(at, timeZone)
  return { year: p.year, month: p.month, day: p.day }
}

/** The first run whose cut-off is at or after `readyAt`, or null when the branch has no runs. */
export function nextRun(b: BranchTimes, readyAt: Date, timeZone: string): When | null {
  if (!b.runs.length) return null
  const runs = [...b.runs].sort((x, y) => x.departsMinute - y.departsMinute)
  const start = dayOf(readyAt, timeZone)
  for (let i = 0; i <= HORIZON_DAYS; i++) {
    const day = addDays(start, i)
    const weekday = String(weekdayOf(day))
    for (const r of runs) {
      if (!r.weekdays.includes(weekday)) continue
      const departsAt = localInstant(day, r.departsMinute, timeZone)
      if (departsAt.getTime() - r.cutoffMinutes * 60_000 >= readyAt.getTime()) {
        return { kind: 'run', departsAt, arrivesAt: new Date(departsAt.getTime() + r.transitMinutes * 60_000) }
      }
    }
  }
  return null
}

/** When units ready at `readyAt` are out on the branch's counter. */
export function collectFrom(b: BranchTimes, readyAt: Date, timeZone: string): When | null {
  const start = dayOf(readyAt, timeZone)
  for (let i = 0; i <= HORIZON_DAYS; i++) {
    const day = addDays(start, i)
    if (!WORKING(weekdayOf(day))) continue
    const opens = localInstant(day, b.counterOpensMinute, timeZone).getTime()
    const closes = localInstant(day, b.counterClosesMinute, timeZone).getTime()
    const at = Math.max(readyAt.getTime(), opens) + b.collectionMinutes * 60_000
    if (at <= closes) return { kind: 'collect', arrivesAt: new Date(at) }
  }
  return null
}

/** When a part back-ordered at `now` reaches the branch: its counter's opening, `leadDays` working days on. */
export function supplierArrival(b: BranchTimes, now: Date, leadDays: number, timeZone: string): Date {
  let day = dayOf(now, timeZone)
  let left = leadDays
  while (left > 0 || !WORKING(weekdayOf(day))) {
    day = addDays(day, 1)
    if (WORKING(weekdayOf(day))) left--
  }
  return localInstant(day, b.counterOpensMinute, timeZone)
}

/** A run or the counter, whichever the order asked for (a branch without runs always means the counter). */
export function whenReady(b: BranchTimes, readyAt: Date, collect: boolean, timeZone: string): When | null {
  return (collect ? null : nextRun(b, readyAt, timeZone)) ?? (b.collection || collect ? collectFrom(b, readyAt, timeZone) : null)
}

const weekdayNames = new Map<string, Intl.DateTimeFormat>()
function weekdayName(at: Date, timeZone: string): string {
  let f = weekdayNames.get(timeZone)
  if (!f) weekdayNames.set(timeZone, f = new Intl.DateTimeFormat('en-GB', { weekday: 'long', timeZone }))
  return f.format(at)
}
const shortDays = new Map<string, Intl.DateTimeFormat>()
function shortDay(at: Date, timeZone: string): string {
  let f = shortDays.get(timeZone)
  if (!f) shortDays.set(timeZone, f = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', timeZone }))
  return f.format(at)
}

const hhmm = (at: Date, timeZone: string) => clockText(localParts(at, timeZone).minute)

/** "today", "tomorrow", "Thursday" (within the week) or "Thu 10 Dec", relative to `now`'s local day. */
function dayWord(at: Date, now: Date, timeZone: string): 'today' | 'tomorrow' | string {
  const a = localParts(now, timeZone)
  const b = localParts(at, timeZone)
  const gap = Math.round((Date.UTC(b.year, b.month - 1, b.day) - Date.UTC(a.year, a.month - 1, a.day)) / 86_400_000)
  if (gap <= 0) return 'today'
  if (gap === 1) return 'tomorrow'
  if (gap < 7) return weekdayName(at, timeZone)
  return shortDay(at, timeZone)
}

/**
 * The promise in words: "next run 14:30, about 15:15", "tomorrow's 08:30 run, about 09:15",
 * "collect from the counter now", "collect from the counter tomorrow from 07:45".
 */
export function promiseWords(when: When | null, now: Date, timeZone: string): string {
  if (!when) return 'no delivery or collection is possible from this branch: please call the counter'
  if (when.kind === 'run') {
    const day = dayWord(when.departsAt, now, timeZone)
    const about = `about ${hhmm(when.arrivesAt, timeZone)}`
    const run = hhmm(when.departsAt, timeZone)
    if (day === 'today') return `next run ${run}, ${about}`
    return `${day === 'tomorrow' ? "tomorrow's" : `${day}'s`} ${run} run, ${about}`
  }
  // out on the counter within a quarter of an hour or so of now: the garage may come for it straight away
  if (when.arrivesAt.getTime() - now.getTime() <= 20 * 60_000) return 'collect from the counter now'
  const day = dayWord(when.arrivesAt, now, timeZone)
  return `collect from the counter ${day === 'today' ? '' : `${day} `}from ${hhmm(when.arrivesAt, timeZone)}`
}

/** "sent today", "sent yesterday", "sent on Thu 3 Dec". */
export function sentWords(at: Date, now: Date, timeZone: string): string {
  const a = localParts(at, timeZone)
  const b = localParts(now, timeZone)
  const gap = Math.round((Date.UTC(b.year, b.month - 1, b.day) - Date.UTC(a.year, a.month - 1, a.day)) / 86_400_000)
  if (gap <= 0) return 'sent today'
  if (gap === 1) return 'sent yesterday'
  return `sent on ${shortDay(at, timeZone)}`
}
