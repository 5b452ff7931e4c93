/** What may happen next to an order, from its state alone (the views offer it, the services enforce it). */
import type { Order } from '../../models/orders'
import { DELIVERY_NOTE_STATUSES } from '../../../shared/types/orders'

/** How long a card order may hold stock without a checkout being opened (the sweep lets it lapse after). */
export const UNPAID_HOLD_MINUTES = 60

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
