/** What may happen next to an order, from its state alone (the views offer it, the services enforce it). */
import type { Order } from '../../models/orders'
import { DELIVERY_NOTE_STATUSES } from '../../../shared/types/orders'

/**
 * How long an unpaid card order holds its stock: without a checkout it lapses in the sweep after this long, and a
 * checkout expires this long after it opens. The payment service keeps a checkout open for 30 minutes at least and
 * 24 hours at most, so the configured value is kept within those.
 */
export const DEFAULT_HOLD_MINUTES = 30
export function holdMinutesOf(configured: unknown): number {
  const n = Number(configured)
  return Number.isFinite(n) ? Math.min(23 * 60, Math.max(30, Math.round(n))) : DEFAULT_HOLD_MINUTES
}

type State = Pick<Order, 'status' | 'paymentMethod' | 'paymentState'>

export function garageMayCancel(o: Pick<Order, 'status'>): boolean {
  return ['awaiting_payment', 'lapsed', 'confirmed'].includes(o.status)
}

export function mayPay(o: State): boolean {
  return o.paymentMethod === 'card' && o.paymentState === 'unpaid' && (o.status === 'awaiting_payment' || o.status === 'lapsed')
}

export function hasInvoice(o: Pick<Order, 'paymentState'>): boolean {
  return o.paymentState !== 'unpaid'
}

export function hasDeliveryNote(o: Pick<Order, 'status'>): boolean {
  return DELIVERY_NOTE_STATUSES.includes(o.status)
}
