/**
 * Issuing invoices and credit notes inside the write transaction of what they record: an invoice with each
 * dispatch (what left, at the prices and tax stated on the order), a credit note for each accepted return,
 * settled warranty claim and accepted old unit, referencing the invoice that charged it. Numbers come from the
 * series counter in the same transaction (numbering.ts); what is printed is stored as issued (both parties with
 * their tax numbers, the notes), and the database refuses any later change. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Organisation } from '../../models/accounts'
import type { Order, OrderLine } from '../../models/orders'
import { DocumentLine, IssuedDocument, type Dispatch } from '../../models/counter'
import { orderReference } from '../../../shared/types/orders'
import type { CreditReason, DocumentParty } from '../../../shared/types/documents'
import type { Formats } from '../../../shared/utils/format'
import { conflict } from '../errors'
import { localDate } from '../orders/zoned-time'
import { partyOf } from '../orders/paperwork'
import type { CreditPiece } from './creditable'
import { documentReference, takeNumber } from './numbering'

/** What is printed on a document besides its lines, stored with it as issued. */
export interface DocumentBody {
  seller: DocumentParty
  buyer: DocumentParty
  orderReference: string
  garageReference: string
  branch: string
  notes: string[]
}

async function bodyFor(t: Transaction, order: Order, branch: string, notes: string[]): Promise<DocumentBody> {
  const [distributor, garage] = await Promise.all([
    Organisation.findOne({ where: { kind: 'distributor' }, transaction: t }),
    Organisation.findByPk(order.organisationId, { transaction: t }),
  ])
  return {
    seller: distributor ? partyOf(distributor) : { name: 'Distributor', address: '', taxNumber: '' },
    buyer: partyOf(garage!),
    orderReference: orderReference(order.id),
    garageReference: order.garageReference ?? '',
    branch,
    notes,
  }
}

type NewLine = Omit<CreditPiece, 'orderLineId'> & { orderLineId: number | null }

type Head = Pick<IssuedDocument, 'kind' | 'organisationId' | 'orderId' | 'dispatchId' | 'invoiceId' | 'reason' | 'issuedAt' | 'taxPoint' | 'currency'> & { body: DocumentBody }

async function write(t: Transaction, head: Head, lines: NewLine[]): Promise<IssuedDocument> {
  const series = head.kind === 'invoice' ? 'INV' : 'CRN'
  const netMinor = lines.reduce((s, l) => s + l.netMinor, 0)
  const taxMinor = lines.reduce((s, l) => s + l.taxMinor, 0)
  if (netMinor < 0 || taxMinor < 0) throw conflict('A document cannot come to less than nothing.')
  const number = await takeNumber(t, series)
  const doc = await IssuedDocument.create({
    ...head, series, number, reference: documentReference(series, number), netMinor, taxMinor, totalMinor: netMinor + taxMinor,
    body: JSON.stringify(head.body),
  }, { transaction: t })
  doc.lines = await DocumentLine.bulkCreate(lines.map((l, position) => ({ ...l, documentId: doc.id, position })), { transaction: t })
  return doc
}

/** The invoice's lines for what a dispatch sent: each part, and each deposit beside it, with the tax stated on the order. */
export function invoiceLines(order: Pick<Order, 'taxRateBp'>, sent: readonly OrderLine[]): NewLine[] {
  return sent.flatMap((l) => [
    { orderLineId: l.id, kind: 'part' as const, sku: l.sku, description: l.description, quantity: l.quantity, unitMinor: l.unitNetMinor, netMinor: l.lineNetMinor, taxBp: order.taxRateBp, taxMinor: l.taxMinor ?? 0 },
    ...(l.coreDepositUnitMinor > 0
      ? [{ orderLineId: l.id, kind: 'core_deposit' as const, sku: l.sku, description: `Core deposit, ${l.sku} (returned with the old unit)`, quantity: l.quantity, unitMinor: l.coreDepositUnitMinor, netMinor: l.coreDepositUnitMinor * l.quantity, taxBp: order.taxRateBp, taxMinor: l.depositTaxMinor ?? 0 }]
      : []),
  ])
}

/**
 * The invoice for one dispatch. Its tax point is the day the goods left, or the day a card order was paid when
 * that was earlier (a payment before the goods leave fixes the tax point: HMRC VAT Notice 700, tax points, from
 * memory); an account invoice names the day payment is due.
 */
export async function issueInvoice(t: Transaction, order: Order, dispatch: Dispatch, sent: readonly OrderLine[], branchName: string, fmt: Formats, garagePaymentDays: number): Promise<IssuedDocument> {
  const paidFirst = order.paymentMethod === 'card' && order.paidAt && order.paidAt < dispatch.dispatchedAt
  const taxPoint = localDate(paidFirst ? order.paidAt! : dispatch.dispatchedAt, fmt.timeZone)
  const notes = order.paymentMethod === 'card'
    ? [`Paid by card${order.paidAt ? ` on ${fmt.day(order.paidAt)}` : ''}: nothing more to pay for these parts.`]
    : [`Charged to your trade account: payment due by ${fmt.day(new Date(dispatch.dispatchedAt.getTime() + garagePaymentDays * 86_400_000))} (${garagePaymentDays} days).`]
  if (sent.some((l) => l.coreDepositUnitMinor > 0)) notes.push('Core deposits and their VAT are credited back when the old units come back and are accepted.')
  return write(t, {
    kind: 'invoice', organisationId: order.organisationId, orderId: order.id, dispatchId: dispatch.id, invoiceId: null, reason: null,
    issuedAt: dispatch.dispatchedAt, taxPoint, currency: order.currency,
    body: await bodyFor(t, order, branchName, notes),
  }, invoiceLines(order, sent))
}

export interface CreditInput {
  invoice: IssuedDocument
  order: Order
  reason: CreditReason
  pieces: NewLine[]
  notes: string[]
  now: Date
}

/**
 * A credit note against an invoice: never more than the invoice charged (each piece comes from creditable.ts, and
 * the notes against an invoice are checked in total here too). Its tax point is the day it is issued.
 */
export async function issueCreditNote(t: Transaction, c: CreditInput, fmt: Formats): Promise<IssuedDocument> {
  const earlier = await IssuedDocument.sum('totalMinor', { where: { invoiceId: c.invoice.id }, transaction: t })
  const total = c.pieces.reduce((s, l) => s + l.netMinor + l.taxMinor, 0)
  if (Number(earlier ?? 0) + total > c.invoice.totalMinor) {
    throw conflict(`That would credit more than invoice ${c.invoice.reference} charged.`)
  }
  const notes = [`Credited against invoice ${c.invoice.reference} of ${fmt.day(c.invoice.issuedAt)}.`, ...c.notes]
  return write(t, {
    kind: 'credit_note', organisationId: c.order.organisationId, orderId: c.order.id, dispatchId: null, invoiceId: c.invoice.id, reason: c.reason,
    issuedAt: c.now, taxPoint: localDate(c.now, fmt.timeZone), currency: c.invoice.currency,
    body: await bodyFor(t, c.order, JSON.parse(c.invoice.body).branch ?? '', notes),
  }, c.pieces)
}
