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

type InvoiceDay = Map<number, { day: string; reference: string }>

/**
 * `localDate` remembered per quarter hour: every zone's offset is a whole number of quarter hours and changes only on
 * one, so every instant in a quarter hour falls on the same local day. A whole ledger then costs a few thousand zone
 * conversions rather than one a row.
 */
export function localDayOf(timeZone: string): (at: Date) => string {
  const seen = new Map<number, string>()
  return (at) => {
    const q = Math.floor(at.getTime() / 900_000)
    let day = seen.get(q)
    if (day === undefined) { day = localDate(at, timeZone); seen.set(q, day) }
    return day
  }
}

/** The first invoice of each order among `docs` (oldest first): its date (local day) and reference. */
export function firstInvoiceOf(docs: readonly Pick<IssuedDocument, 'orderId' | 'issuedAt' | 'reference'>[], timeZone: string): InvoiceDay {
  const first: InvoiceDay = new Map()
  const dayOf = localDayOf(timeZone)
  for (const d of docs) if (!first.has(d.orderId)) first.set(d.orderId, { day: dayOf(new Date(d.issuedAt)), reference: d.reference })
  return first
}

/** A ledger entry as a move: an order's charge runs from its first invoice (null while there is none). */
export function moveOfEntry(r: Pick<LedgerEntry, 'id' | 'orderId' | 'kind' | 'amountMinor' | 'reference' | 'description' | 'createdAt'>, invoices: InvoiceDay, dayOf: (at: Date) => string): LedgerMove {
  const move: LedgerMove = { id: r.id, day: dayOf(r.createdAt), reference: r.reference, description: r.description, amountMinor: r.amountMinor }
  if (r.orderId === null || !INVOICED_KINDS.includes(r.kind)) return move
  const inv = invoices.get(r.orderId)
  return { ...move, dueFrom: inv?.day ?? null, invoice: inv?.reference ?? null }
}

export async function owedLedgerOf(organisationId: number, rows: LedgerEntry[], timeZone: string, t?: Transaction): Promise<OwedLedger> {
  const [docs, allocs] = await Promise.all([
    IssuedDocument.findAll({
      where: { organisationId, kind: 'invoice' }, attributes: ['id', 'orderId', 'issuedAt', 'reference'],
      order: [['issuedAt', 'ASC'], ['id', 'ASC']], transaction: t,
    }),
    PaymentAllocation.findAll({ where: { organisationId }, order: [['id', 'ASC']], transaction: t }),
  ])
  const invoices = firstInvoiceOf(docs, timeZone)
  const dayOf = localDayOf(timeZone)
  const moves = rows.map((r) => moveOfEntry(r, invoices, dayOf))
  return { rows, moves, allocations: allocs.map((a) => ({ paymentId: a.paymentEntryId, chargeId: a.chargeEntryId, amountMinor: a.amountMinor })) }
}

/** The garage's whole ledger, in the order it was written, as moves. */
export async function owedLedger(organisationId: number, timeZone: string, t?: Transaction): Promise<OwedLedger> {
  const rows = await LedgerEntry.findAll({ where: { organisationId }, order: [['id', 'ASC']], transaction: t })
  return owedLedgerOf(organisationId, rows, timeZone, t)
}
