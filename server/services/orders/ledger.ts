/**
 * What an order writes on the garage's ledger (the statement): its charges, the payment that settles a card
 * order, the credit when it is cancelled, refunds sent back. Every entry is written inside the caller's write
 * transaction, with the change it belongs to. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { CoreReturn, LedgerEntry, OrderLine, type Order } from '../../models/orders'
import { orderReference } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'

/**
 * The order's charges on the ledger (goods + tax, and deposits), and the old units it now expects back.
 * Runs when an account order is placed, or when a card order is paid (then `paymentIntentId` books the
 * payment that settles them, so the card garage's balance is back where it was).
 */
export async function bookOrderCharges(t: Transaction, order: Order, paymentIntentId: string | null, fmt: Formats, options: { expectCores?: boolean } = {}): Promise<void> {
  const entry = { organisationId: order.organisationId, orderId: order.id, reference: orderReference(order.id) }
  await LedgerEntry.create({
    ...entry, kind: 'order', amountMinor: order.subtotalMinor + order.taxMinor,
    description: `Parts ${fmt.money(order.subtotalMinor)} + VAT ${fmt.money(order.taxMinor)}`,
  }, { transaction: t })
  if (order.coreDepositMinor > 0) {
    await LedgerEntry.create({ ...entry, kind: 'core_deposit', amountMinor: order.coreDepositMinor, description: 'Deposits on old units to be returned' }, { transaction: t })
  }
  if (paymentIntentId) {
    await LedgerEntry.create({ ...entry, kind: 'payment', amountMinor: -order.totalMinor, description: 'Card payment received', externalId: paymentIntentId }, { transaction: t })
  }
  if (options.expectCores === false) return
  const lines = order.lines ?? await OrderLine.findAll({ where: { orderId: order.id }, transaction: t })
  for (const l of lines) {
    if (l.coreDepositUnitMinor <= 0) continue
    if (await CoreReturn.findOne({ where: { orderLineId: l.id }, transaction: t })) continue
    await CoreReturn.create({
      organisationId: order.organisationId, orderId: order.id, orderLineId: l.id, status: 'expected',
      quantityExpected: l.quantity, depositUnitMinor: l.coreDepositUnitMinor,
    }, { transaction: t })
  }
}

/** The whole order credited back: a paid card order is refunded after this, an account order is done. */
export async function creditCancelledOrder(t: Transaction, order: Order): Promise<void> {
  await LedgerEntry.create({
    organisationId: order.organisationId, orderId: order.id, kind: 'credit', amountMinor: -order.totalMinor, reference: orderReference(order.id),
    description: order.paymentState === 'on_account' ? 'Order cancelled: credited to the account' : 'Order cancelled: payment to be refunded',
  }, { transaction: t })
}

/** A refund the payment service made, booked once under its id (the webhook and the sender may both see it). */
export async function bookRefundOnce(
  t: Transaction, refund: { id: string; amount: number },
  entry: { organisationId: number; orderId: number; coreReturnId?: number; description: string },
): Promise<void> {
  if (await LedgerEntry.findOne({ where: { kind: 'refund', externalId: refund.id }, transaction: t })) return
  await LedgerEntry.create({
    ...entry, kind: 'refund', amountMinor: refund.amount, reference: orderReference(entry.orderId), externalId: refund.id,
  }, { transaction: t })
}
