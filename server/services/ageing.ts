/**
 * What a garage still owes, item by item, and how old it is. Every charge on the ledger (a positive entry: an
 * order, its deposits, a refund paid out) is an item falling due `paymentDays` after its invoice's date (the first
 * INV document of its order: the garage is not asked to pay for parts before they are invoiced), or after the local
 * day it was booked when no document belongs to it (a refund paid out); a charge of an order not yet invoiced is
 * open but not yet due. A payment the admin allocated pays the items it names first; every other payment or credit
 * (a negative entry) settles items oldest first, so the oldest debt is always the one cleared (common practice for
 * a trade account without remittance advice). Buckets count whole days past the due
 * date: not yet due or due today is current, then 1-30, 31-60, 61-90 and over 90 days overdue. Plain Node.
 */
import type { Ageing, AgeingBucket, OpenItem } from '../../shared/types/money-owed'

export interface LedgerMove {
  id: number; day: string; reference: string; description: string; amountMinor: number
  /** the day the payment days run from: the invoice's date; null = its order is not invoiced yet; absent = `day` */
  dueFrom?: string | null
  /** the invoice that charged it, when there is one */
  invoice?: string | null
}

/** Part of a payment the admin set against one charge (`chargeId`: the charge's ledger entry). */
export interface Allocation { paymentId: number; chargeId: number; amountMinor: number }


const dayNumber = (day: string) => Math.round(Date.parse(`${day}T00:00:00Z`) / 86_400_000)

/** `day` plus `n` calendar days, YYYY-MM-DD. */
export function dayPlus(day: string, n: number): string {
  return new Date((dayNumber(day) + n) * 86_400_000).toISOString().slice(0, 10)
}

/** Whole days from `dueOn` to `today`, 0 when not yet due, due today or not due at all yet (null: not invoiced). */
export function daysPast(dueOn: string | null, today: string): number {
  return dueOn === null ? 0 : Math.max(0, dayNumber(today) - dayNumber(dueOn))
}

export function bucketOf(daysOverdue: number): AgeingBucket {
  if (daysOverdue <= 0) return 'current'
  if (daysOverdue <= 30) return 'd1_30'
  if (daysOverdue <= 60) return 'd31_60'
  if (daysOverdue <= 90) return 'd61_90'
  return 'over90'
}

/**
 * What the allocations pay on each charge: each allocation is capped by what is left of its charge and of its
 * payment, so a stale or doubled allocation can never pay more than either (the rest goes oldest first).
 */
function allocatedPaid(moves: readonly LedgerMove[], allocations: readonly Allocation[]): { paid: Map<number, number>; allocatedMinor: number } {
  const amount = new Map(moves.map((m) => [m.id, m.amountMinor]))
  const paymentLeft = new Map<number, number>()
  const paid = new Map<number, number>()
  let allocatedMinor = 0
  for (const a of allocations) {
    const charge = amount.get(a.chargeId) ?? 0
    const payment = -(amount.get(a.paymentId) ?? 0)
    if (charge <= 0 || payment <= 0) continue
    const left = paymentLeft.get(a.paymentId) ?? payment
    const take = Math.max(0, Math.min(a.amountMinor, left, charge - (paid.get(a.chargeId) ?? 0)))
    paymentLeft.set(a.paymentId, left - take)
    paid.set(a.chargeId, (paid.get(a.chargeId) ?? 0) + take)
    allocatedMinor += take
  }
  return { paid, allocatedMinor }
}

/**
 * The items still open on `today`, oldest first: allocated amounts pay the charges they name, then every other
 * credit settles the oldest charges (by the day each was booked).
 */
export function openItemsOf(moves: readonly LedgerMove[], paymentDays: number, today: string, allocations: readonly Allocation[] = []): OpenItem[] {
  const charges = moves.filter((m) => m.amountMinor > 0).sort((a, b) => a.day.localeCompare(b.day) || a.id - b.id)
  const { paid, allocatedMinor } = allocatedPaid(moves, allocations)
  let credit = moves.reduce((s, m) => s + (m.amountMinor < 0 ? -m.amountMinor : 0), 0) - allocatedMinor
  const open: OpenItem[] = []
  for (const c of charges) {
    const already = paid.get(c.id) ?? 0
    const pooled = Math.min(credit, c.amountMinor - already)
    credit -= pooled
    const paidMinor = already + pooled
    if (paidMinor === c.amountMinor) continue
    const from = c.dueFrom === undefined ? c.day : c.dueFrom
    const dueOn = from === null ? null : dayPlus(from, paymentDays)
    const daysOverdue = daysPast(dueOn, today)
    open.push({
      entryId: c.id, reference: c.reference, description: c.description, bookedOn: c.day, invoice: c.invoice ?? null, invoicedOn: c.dueFrom ?? null, dueOn,
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
