/** The shapes the order routes answer with (shared/types/orders.ts), from the stored rows. */
import { User, type Branch } from '../../models/accounts'
import type { CoreReturn, Order, OrderLine } from '../../models/orders'
import { orderLineTaxMinor } from '../../../shared/utils/order-totals'
import {
  COUNTER_MOVES, CORE_RETURN_LABELS, ORDER_STATUS_LABELS, PAYMENT_STATE_LABELS, orderReference,
  type BranchView, type CoreReturnView, type OrderDetail, type OrderSummary,
} from '../../../shared/types/orders'
import { garageMayCancel, hasInvoice, mayPay } from './rules'

export function branchView(b: Pick<Branch, 'id' | 'code' | 'name'>): BranchView {
  return { id: b.id, code: b.code, name: b.name }
}

export function coreReturnView(cr: CoreReturn, line: OrderLine | undefined, garage?: string): CoreReturnView {
  const qty = cr.quantityBooked ?? cr.quantityExpected
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
    depositMinor: cr.depositUnitMinor * qty,
    creditedMinor: cr.creditedMinor ?? null,
    garageNote: cr.garageNote ?? '',
    reason: cr.reason ?? null,
    bookedAt: cr.bookedAt?.toISOString() ?? null,
    decidedAt: cr.decidedAt?.toISOString() ?? null,
    refundPending: !!cr.refundPending,
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
function timelineOf(o: Order): { at: string; label: string }[] {
  const steps: [Date | null | undefined, string][] = [
    [o.createdAt, 'Order placed'], [o.declinedAt, 'Card declined'], [o.paidAt, 'Paid by card'], [o.pickingAt, 'Picking started'],
    [o.dispatchedAt, 'Dispatched'], [o.deliveredAt, 'Delivered'], [o.cancelledAt, 'Cancelled'],
  ]
  return steps.flatMap(([d, label]) => (d ? [{ at: d.toISOString(), label }] : [])).sort((a, b) => a.at.localeCompare(b.at))
}

/** The whole order as the garage (`garage`) or the counter (`counter`, with its next moves) sees it. */
export async function orderDetail(o: Order, perspective: 'garage' | 'counter'): Promise<OrderDetail> {
  const lines = [...(o.lines ?? [])].sort((a, b) => a.position - b.position || a.id - b.id)
  const placedBy = await User.findByPk(o.placedByUserId, { attributes: ['name'] })
  const byLine = new Map(lines.map((l) => [l.id, l]))
  const moves = COUNTER_MOVES[o.status] ?? []
  return {
    ...orderSummary(o, lines.length),
    quoteId: o.quoteId ?? null,
    subtotalMinor: o.subtotalMinor,
    coreDepositMinor: o.coreDepositMinor,
    taxRateBp: o.taxRateBp,
    taxMinor: o.taxMinor,
    lines: lines.map((l) => ({
      id: l.id, sku: l.sku, description: l.description, quantity: l.quantity, unitListMinor: l.unitListMinor,
      unitNetMinor: l.unitNetMinor, lineNetMinor: l.lineNetMinor, lineTaxMinor: orderLineTaxMinor(l.lineNetMinor, o.taxRateBp),
      coreDepositUnitMinor: l.coreDepositUnitMinor, quotedUnitNetMinor: l.quotedUnitNetMinor ?? null,
    })),
    coreReturns: (o.coreReturns ?? []).sort((a, b) => a.id - b.id).map((cr) => coreReturnView(cr, byLine.get(cr.orderLineId))),
    placedBy: placedBy?.name ?? '',
    decline: o.declineReason && o.paymentState === 'unpaid'
      ? { reason: o.declineReason, code: o.declineCode ?? null, at: (o.declinedAt ?? o.updatedAt).toISOString() }
      : null,
    can: perspective === 'garage'
      ? { pay: mayPay(o), cancel: garageMayCancel(o), invoice: hasInvoice(o) }
      : { pay: false, cancel: moves.includes('cancelled'), invoice: hasInvoice(o) },
    ...(perspective === 'counter' ? { nextStatuses: moves } : {}),
    timeline: timelineOf(o),
  }
}
