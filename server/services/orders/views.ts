/** The shapes the order routes answer with (shared/types/orders.ts), from the stored rows. */
import { Op } from 'sequelize'
import { User, type Branch } from '../../models/accounts'
import type { CoreReturn, Order, OrderLine } from '../../models/orders'
import { Dispatch, IssuedDocument, PartReturn } from '../../models/counter'
import { shareOfTax } from '../../../shared/utils/order-totals'
import {
  COUNTER_MOVES, CORE_RETURN_LABELS, LINE_STATE_LABELS, ORDER_STATUS_LABELS, PAYMENT_STATE_LABELS, orderReference,
  type BranchView, type CoreReturnView, type LineState, type DispatchView, type OrderDetail, type OrderLineView, type OrderSummary,
} from '../../../shared/types/orders'
import { garageMayCancel, hasInvoice, mayPay } from './rules'
import { branchTimes } from './branches'
import { linePromises } from './line-promises'
import { pickList } from './picking'
import { sentWords } from './promise'
import { systemClock, type ViewClock } from './clock'

export function branchView(b: Pick<Branch, 'id' | 'code' | 'name'>): BranchView {
  return { id: b.id, code: b.code, name: b.name }
}

export function coreReturnView(cr: CoreReturn, line: OrderLine | undefined, garage?: string, creditNote?: { id: number; reference: string } | null): CoreReturnView {
  const qty = cr.quantityBooked ?? cr.quantityExpected
  const depositMinor = cr.depositUnitMinor * qty
  const tax = line && line.quantity >= qty ? shareOfTax(line.depositTaxMinor ?? 0, qty, line.quantity) : 0
  return {
    id: cr.id,
    orderId: cr.orderId,
    orderReference: orderReference(cr.orderId),
    orderLineId: cr.orderLineId,
    sku: line?.sku ?? '',
    description: line?.description ?? '',
    status: cr.status,
    statusLabel: CORE_RETURN_LABELS[cr.status],
    quantityExpected: cr.quantityExpected,
    quantityBooked: cr.quantityBooked ?? null,
    depositUnitMinor: cr.depositUnitMinor,
    depositMinor,
    depositGrossMinor: depositMinor + tax,
    creditedMinor: cr.creditedMinor ?? null,
    garageNote: cr.garageNote ?? '',
    reason: cr.reason ?? null,
    bookedAt: cr.bookedAt?.toISOString() ?? null,
    decidedAt: cr.decidedAt?.toISOString() ?? null,
    refundPending: !!cr.refundPending,
    creditNote: creditNote ?? null,
    ...(garage ? { garage } : {}),
  }
}

export function orderSummary(o: Order, lineCount?: number): OrderSummary {
  return {
    id: o.id,
    reference: orderReference(o.id),
    status: o.status,
    statusLabel: ORDER_STATUS_LABELS[o.status],
    paymentMethod: o.paymentMethod,
    paymentState: o.paymentState,
    paymentStateLabel: PAYMENT_STATE_LABELS[o.paymentState],
    totalMinor: o.totalMinor,
    currency: o.currency,
    branch: o.branch ? branchView(o.branch) : { id: o.branchId, code: '', name: '' },
    garageReference: o.garageReference ?? '',
    lineCount: lineCount ?? o.lines?.length ?? 0,
    createdAt: o.createdAt.toISOString(),
    ...(o.organisation ? { garage: { id: o.organisation.id, name: o.organisation.name } } : {}),
  }
}

/** What happened to the order, oldest first. */
function timelineOf(o: Order, dispatches: Dispatch[]): { at: string; label: string }[] {
  const several = dispatches.length > 1
  const steps: [Date | null | undefined, string][] = [
    [o.createdAt, 'Order placed'], [o.declinedAt, 'Card declined'], [o.paidAt, 'Paid by card'], [o.pickingAt, 'Picking started'],
    ...dispatches.map((d) => [d.dispatchedAt, several ? `Dispatch ${d.seq} sent` : 'Dispatched'] as [Date, string]),
    ...(dispatches.length ? [] : [[o.dispatchedAt, 'Dispatched'] as [Date | null, string]]),
    [o.deliveredAt, 'Delivered'], [o.cancelledAt, o.status === 'cancelled' ? 'Cancelled' : 'Lines not yet sent cancelled'],
  ]
  return steps.flatMap(([d, label]) => (d ? [{ at: d.toISOString(), label }] : [])).sort((a, b) => a.at.localeCompare(b.at))
}

/** Units of each sent line already asked back (a turned-down return frees its units to be asked again). */
async function askedBack(orderId: number): Promise<Map<number, number>> {
  const rows = await PartReturn.findAll({ where: { orderId, status: { [Op.ne]: 'rejected' } }, attributes: ['orderLineId', 'quantity'] })
  const out = new Map<number, number>()
  for (const r of rows) out.set(r.orderLineId, (out.get(r.orderLineId) ?? 0) + r.quantity)
  return out
}

/** The whole order as the garage (`garage`) or the counter (`counter`, with its next moves and pick list) sees it. */
export async function orderDetail(o: Order, perspective: 'garage' | 'counter', clock: ViewClock = systemClock()): Promise<OrderDetail> {
  const lines = [...(o.lines ?? [])].sort((a, b) => a.position - b.position || a.id - b.id)
  const [placedBy, dispatches, invoices, notes, asked, times] = await Promise.all([
    User.findByPk(o.placedByUserId, { attributes: ['name'] }),
    Dispatch.findAll({ where: { orderId: o.id }, order: [['seq', 'ASC']] }),
    IssuedDocument.findAll({ where: { orderId: o.id, kind: 'invoice' }, attributes: ['id', 'reference', 'dispatchId'] }),
    IssuedDocument.findAll({ where: { orderId: o.id, kind: 'credit_note' }, attributes: ['id', 'reference'] }),
    askedBack(o.id),
    branchTimes(),
  ])
  const names = new Map(times.map((b) => [b.id, b.name]))
  const branchById = new Map(times.map((b) => [b.id, branchView(b)]))
  const home = times.find((b) => b.id === o.branchId)!
  const promises = linePromises(o, lines, home, clock.now, clock.timeZone, names)
  const invoiceOf = new Map(invoices.map((d) => [d.dispatchId, { id: d.id, reference: d.reference }]))
  const sentOn = new Map(dispatches.map((d) => [d.id, d.dispatchedAt]))
  const noteRef = new Map(notes.map((n) => [n.id, { id: n.id, reference: n.reference }]))
  const byLine = new Map(lines.map((l) => [l.id, l]))
  const moves = COUNTER_MOVES[o.status] ?? []
  const lineViews: OrderLineView[] = lines.map((l) => {
    const sent = l.dispatchId ? sentOn.get(l.dispatchId) ?? null : null
    const promise = promises.get(l.id)!
    const branchId = l.sourceBranchId ?? null
    return {
      id: l.id, sku: l.sku, description: l.description, quantity: l.quantity, unitListMinor: l.unitListMinor,
      unitNetMinor: l.unitNetMinor, lineNetMinor: l.lineNetMinor, lineTaxMinor: l.taxMinor ?? 0,
      coreDepositUnitMinor: l.coreDepositUnitMinor, coreDepositTaxMinor: l.depositTaxMinor ?? 0, quotedUnitNetMinor: l.quotedUnitNetMinor ?? null,
      source: l.source ?? 'home', branch: branchId ? branchById.get(branchId) ?? null : null,
      arrivesAt: promise.arrivesAt?.toISOString() ?? null, promise: sent ? sentWords(sent, clock.now, clock.timeZone) : promise.promise,
      fulfilment: l.fulfilment ?? o.fulfilment ?? 'ship_available',
      state: l.state ?? 'reserved', stateLabel: LINE_STATE_LABELS[(l.state ?? 'reserved') as LineState], pickedQuantity: l.pickedQuantity ?? null,
      dispatchedAt: sent?.toISOString() ?? null,
      returnableQuantity: l.state === 'dispatched' && invoiceOf.has(l.dispatchId ?? 0) ? Math.max(0, l.quantity - (asked.get(l.id) ?? 0)) : 0,
    }
  })
  const dispatchViews: DispatchView[] = dispatches.map((d) => ({
    id: d.id, seq: d.seq, at: d.dispatchedAt.toISOString(), lines: lines.filter((l) => l.dispatchId === d.id).length, invoice: invoiceOf.get(d.id) ?? null,
  }))
  return {
    ...orderSummary(o, lines.length),
    quoteId: o.quoteId ?? null,
    fulfilment: o.fulfilment ?? 'ship_available',
    collect: !!o.collect,
    subtotalMinor: o.subtotalMinor,
    coreDepositMinor: o.coreDepositMinor,
    taxRateBp: o.taxRateBp,
    taxMinor: o.taxMinor,
    lines: lineViews,
    coreReturns: (o.coreReturns ?? []).sort((a, b) => a.id - b.id).map((cr) => coreReturnView(cr, byLine.get(cr.orderLineId), undefined, noteRef.get(cr.creditNoteId ?? 0))),
    dispatches: dispatchViews,
    placedBy: placedBy?.name ?? '',
    decline: o.declineReason && o.paymentState === 'unpaid'
      ? { reason: o.declineReason, code: o.declineCode ?? null, at: (o.declinedAt ?? o.updatedAt).toISOString() }
      : null,
    can: perspective === 'garage'
      ? { pay: mayPay(o), cancel: garageMayCancel(o), invoice: hasInvoice(o), returnLines: lineViews.some((l) => l.returnableQuantity > 0) }
      : { pay: false, cancel: moves.includes('cancelled'), invoice: hasInvoice(o), returnLines: false },
    ...(perspective === 'counter' ? { nextStatuses: moves, pickList: await pickList(o, clock, names) } : {}),
    timeline: timelineOf(o, dispatches),
  }
}
