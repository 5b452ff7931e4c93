/**
 * What a garage still owes, item by item, and how old it is. Every charge on the ledger (a positive entry: an
 * order, its deposits, a refund paid out) is an item falling due `paymentDays` after the local day it was booked;
 * every payment or credit (a negative entry) settles items oldest first, so the oldest debt is always the one
 * cleared (common practice for a trade account without remittance advice). Buckets count whole days past the due
 * date: not yet due or due today is current, then 1-30, 31-60, 61-90 and over 90 days overdue. Plain Node.
 */
import type { Ageing, AgeingBucket, OpenItem } from '../../shared/types/money-owed'

export interface LedgerMove { id: number; day: string; reference: string; description: string; amountMinor: number }


const dayNumber = (day: string) => Math.round(Date.parse(`${day}T00:00:00Z`) / 86_400_000)

/** `day` plus `n` calendar days, YYYY-MM-DD. */
export function dayPlus(day: string, n: number): string {
  return new Date((dayNumber(day) + n) * 86_400_000).toISOString().slice(0, 10)
}

export function bucketOf(daysOverdue: number): AgeingBucket {
  if (daysOverdue <= 0) return 'current'
  if (daysOverdue <= 30) return 'd1_30'
  if (daysOverdue <= 60) return 'd31_60'
  if (daysOverdue <= 90) return 'd61_90'
  return 'over90'
}

/** The items still open on `today`, oldest first, after settling every credit against the oldest charges. */
export function openItemsOf(moves: readonly LedgerMove[], paymentDays: number, today: string): OpenItem[] {
  const charges = moves.filter((m) => m.amountMinor > 0).sort((a, b) => a.day.localeCompare(b.day) || a.id - b.id)
  let credit = moves.reduce((s, m) => s + (m.amountMinor < 0 ? -m.amountMinor : 0), 0)
  const open: OpenItem[] = []
  for (const c of charges) {
    const paidMinor = Math.min(credit, c.amountMinor)
    credit -= paidMinor
    if (paidMinor === c.amountMinor) continue
    const dueOn = dayPlus(c.day, paymentDays)
    const daysOverdue = Math.max(0, dayNumber(today) - dayNumber(dueOn))
    open.push({
      entryId: c.id, reference: c.reference, description: c.description, bookedOn: c.day, dueOn,
      amountMinor: c.amountMinor, paidMinor, openMinor: c.amountMinor - paidMinor, daysOverdue, bucket: bucketOf(daysOverdue),
    })
  }
  return open
}

export function ageingOf(items: readonly OpenItem[]): Ageing {
  const a: Ageing = { current: 0, d1_30: 0, d31_60: 0, d61_90: 0, over90: 0 }
  for (const i of items) a[i.bucket] += i.openMinor
  return a
}
