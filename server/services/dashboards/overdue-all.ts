/**
 * What every garage owes today, by ageing bucket: the same rule as each garage's statement (ageing.ts, due dates
 * from the invoice, allocations first), worked from three reads of the whole ledger grouped in JS rather than a
 * query per garage. Plain Node.
 */
import { Organisation } from '../../models/accounts'
import { LedgerEntry } from '../../models/orders'
import { IssuedDocument } from '../../models/counter'
import { PaymentAllocation } from '../../models/money-owed'
import type { Ageing } from '../../../shared/types/money-owed'
import { ageingOf, openItemsOf, type Allocation, type LedgerMove } from '../ageing'
import type { ViewClock } from '../orders/clock'
import { localDate } from '../orders/zoned-time'
import { firstInvoiceOf, localDayOf, moveOfEntry } from '../owed-moves'

function grouped<T>(list: readonly T[], key: (t: T) => number): Map<number, T[]> {
  const m = new Map<number, T[]>()
  for (const t of list) {
    const k = key(t)
    const g = m.get(k)
    if (g) g.push(t)
    else m.set(k, [t])
  }
  return m
}

export async function overdueOfAll(clock: ViewClock): Promise<Ageing & { garages: number }> {
  const [garages, entries, docs, allocs] = await Promise.all([
    Organisation.findAll({ where: { kind: 'garage', paymentTerms: 'account' }, attributes: ['id', 'paymentDays'] }),
    LedgerEntry.findAll({ attributes: ['id', 'organisationId', 'orderId', 'kind', 'amountMinor', 'reference', 'createdAt'], order: [['id', 'ASC']], raw: true }),
    IssuedDocument.findAll({ where: { kind: 'invoice' }, attributes: ['id', 'orderId', 'issuedAt', 'reference'], order: [['issuedAt', 'ASC'], ['id', 'ASC']], raw: true }),
    PaymentAllocation.findAll({ raw: true }),
  ])
  const today = localDate(clock.now, clock.timeZone)
  const invoices = firstInvoiceOf(docs, clock.timeZone)
  const dayOf = localDayOf(clock.timeZone)
  const byOrg = grouped(entries, (e) => e.organisationId)
  const allocByOrg = grouped(allocs, (a) => a.organisationId)
  const total: Ageing = { current: 0, d1_30: 0, d31_60: 0, d61_90: 0, over90: 0 }
  let owing = 0
  for (const g of garages) {
    const moves: LedgerMove[] = (byOrg.get(g.id) ?? []).map((e) => moveOfEntry({ ...e, description: '', createdAt: new Date(e.createdAt) }, invoices, dayOf))
    const allocations: Allocation[] = (allocByOrg.get(g.id) ?? []).map((a) => ({ paymentId: a.paymentEntryId, chargeId: a.chargeEntryId, amountMinor: a.amountMinor }))
    const a = ageingOf(openItemsOf(moves, g.paymentDays ?? 0, today, allocations))
    if (a.d1_30 + a.d31_60 + a.d61_90 + a.over90 > 0) owing++
    for (const k of Object.keys(total) as (keyof Ageing)[]) total[k] += a[k]
  }
  return { ...total, garages: owing }
}
