/**
 * A garage's ledger as the moves that work out what it owes: each charge of an order (parts, deposits) with the
 * date of its order's first invoice (null while nothing is invoiced), and the admin's allocations of account
 * payments. Grouped in JS, so the queries are plain selects on any database. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { LedgerEntry } from '../models/orders'
import { IssuedDocument } from '../models/counter'
import { PaymentAllocation } from '../models/money-owed'
import type { LedgerKind } from '../../shared/types/orders'
import { localDate } from './orders/zoned-time'
import type { Allocation, LedgerMove } from './ageing'

/** Charges an invoice states: they fall due from its date. */
const INVOICED_KINDS: readonly LedgerKind[] = ['order', 'core_deposit']

export interface OwedLedger { rows: LedgerEntry[]; moves: LedgerMove[]; allocations: Allocation[] }

/** The first invoice of each of the garage's orders: its date (local day) and reference. */
async function firstInvoices(organisationId: number, timeZone: string, t?: Transaction): Promise<Map<number, { day: string; reference: string }>> {
  const docs = await IssuedDocument.findAll({
    where: { organisationId, kind: 'invoice' }, attributes: ['id', 'orderId', 'issuedAt', 'reference'],
    order: [['issuedAt', 'ASC'], ['id', 'ASC']], transaction: t,
  })
  const first = new Map<number, { day: string; reference: string }>()
  for (const d of docs) if (!first.has(d.orderId)) first.set(d.orderId, { day: localDate(d.issuedAt, timeZone), reference: d.reference })
  return first
}

export async function owedLedgerOf(organisationId: number, rows: LedgerEntry[], timeZone: string, t?: Transaction): Promise<OwedLedger> {
  const [invoices, allocs] = await Promise.all([
    firstInvoices(organisationId, timeZone, t),
    PaymentAllocation.findAll({ where: { organisationId }, order: [['id', 'ASC']], transaction: t }),
  ])
  const moves = rows.map((r): LedgerMove => {
    const move: LedgerMove = { id: r.id, day: localDate(r.createdAt, timeZone), reference: r.reference, description: r.description, amountMinor: r.amountMinor }
    if (r.orderId === null || !INVOICED_KINDS.includes(r.kind)) return move
    const inv = invoices.get(r.orderId)
    return { ...move, dueFrom: inv?.day ?? null, invoice: inv?.reference ?? null }
  })
  return { rows, moves, allocations: allocs.map((a) => ({ paymentId: a.paymentEntryId, chargeId: a.chargeEntryId, amountMinor: a.amountMinor })) }
}

/** The garage's whole ledger, in the order it was written, as moves. */
export async function owedLedger(organisationId: number, timeZone: string, t?: Transaction): Promise<OwedLedger> {
  const rows = await LedgerEntry.findAll({ where: { organisationId }, order: [['id', 'ASC']], transaction: t })
  return owedLedgerOf(organisationId, rows, timeZone, t)
}
