/**
 * The distributor's finished dashboards, kept in this process by range, time zone, currency, today's local day (what
 * is overdue moves with it) and the revision counters of everything the dashboard reads: `catalogue_revisions.trade`
 * (orders and their lines, returns, ledger, allocations, documents, organisations, branches, price versions: one more
 * per writing transaction, migration 0021) and `.prices` (part prices). The counters are read before the figures, so
 * a write landing meanwhile can only make a kept answer newer than its key, never older: the next request misses and
 * works it out again. Each process keeps its own; the counters live in the database, so they all agree. Plain Node.
 */
import type { DistributorDashboard } from '../../../shared/types/dashboards'
import type { Formats } from '../../../shared/utils/format'
import type { ViewClock } from '../orders/clock'
import { localDate } from '../orders/zoned-time'
import { num, rows, type Span } from './range'

const KEPT = 16
const kept = new Map<string, DistributorDashboard>()

/** The kept answer for this key, or `work()`'s, kept for next time (the oldest dropped beyond `KEPT`). */
export async function cachedAnswer(span: Span, clock: ViewClock, fmt: Formats, work: () => Promise<DistributorDashboard>): Promise<DistributorDashboard> {
  const [rev] = await rows<{ trade: number; prices: number }>('SELECT trade, prices FROM catalogue_revisions WHERE id = 1', {})
  const key = JSON.stringify([span.from, span.to, span.timeZone, fmt.currency, localDate(clock.now, clock.timeZone), num(rev?.trade), num(rev?.prices)])
  const hit = kept.get(key)
  if (hit) return hit
  const answer = await work()
  kept.set(key, answer)
  for (const old of kept.keys()) {
    if (kept.size <= KEPT) break
    kept.delete(old)
  }
  return answer
}

/** Forgets every kept answer (the benchmark's cold runs). */
export function forgetAnswers(): void {
  kept.clear()
}
