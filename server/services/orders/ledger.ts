/**
 * What an order writes on the garage's ledger (the statement): its charges, the payment that settles a card
 * order, the credit when it is cancelled, refunds sent back. Every entry is written inside the caller's write
 * transaction, with the change it belongs to. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { CoreReturn, LedgerEntry, OrderLine, type Order } from '../../models/orders'
import { orderReference } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'

/** The deposits an order charges with their tax (the core deposit rule: shared/utils/order-totals.ts). */
export function depositGrossOf(order: Order): number {
  return order.coreDepositMinor + (order.lines ?? []).reduce((s, l) => s + (l.depositTaxMinor ?? 0), 0)
}

/**
 * The order's charges on the ledger (parts and their tax; deposits and their tax). Runs when an account order is
 * placed, or when a card order is paid (then `paymentIntentId` books the payment that settles them, so the card
 * garage's balance is back where it was). The old units due back are expected once their parts leave (dispatch).
 */
export async function bookOrderCharges(t: Transaction, order: Order, paymentIntentId: string | null, fmt: Formats): Promise<void> {
  const entry = { organisationId: order.organisationId, orderId: order.id, reference: orderReference(order.id) }
  if (!order.lines) order.lines = await OrderLine.findAll({ where: { orderId: order.id }, transaction: t })
  const deposits = depositGrossOf(order)
  const partsTax = order.taxMinor - (deposits - order.coreDepositMinor)
  await LedgerEntry.create({
    ...entry, kind: 'order', amountMinor: order.totalMinor - deposits,
    description: `Parts ${fmt.money(order.subtotalMinor)} + VAT ${fmt.money(partsTax)}`,
  }, { transaction: t })
  if (deposits > 0) {
    await LedgerEntry.create({
      ...entry, kind: 'core_deposit', amountMinor: deposits,
      description: `Deposits on old units to be returned ${fmt.money(order.coreDepositMinor)} + VAT ${fmt.money(deposits - order.coreDepositMinor)}`,
    }, { transaction: t })
  }
  if (paymentIntentId) {
    await LedgerEntry.create({ ...entry, kind: 'payment', amountMinor: -order.totalMinor, description: 'Card payment received', externalId: paymentIntentId }, { transaction: t })
  }
}

/** The old units an order's sent lines are expected to bring back, one per line with a deposit. */
export async function expectCores(t: Transaction, order: Pick<Order, 'id' | 'organisationId'>, lines: readonly OrderLine[]): Promise<void> {
  for (const l of lines) {
    if (l.coreDepositUnitMinor <= 0) continue
    if (await CoreReturn.findOne({ where: { orderLineId: l.id }, transaction: t })) continue
    await CoreReturn.create({
      organisationId: order.organisationId, orderId: order.id, orderLineId: l.id, status: 'expected',
      quantityExpected: l.quantity, depositUnitMinor: l.coreDepositUnitMinor,
    }, { transaction: t })
  }
}

/**
 * What was not sent credited back (the whole order unless `amountMinor` says less): a paid card order is refunded
 * after this, an account order is done.
 */
export async function creditCancelledOrder(t: Transaction, order: Order, amountMinor = order.totalMinor): Promise<void> {
  const part = amountMinor < order.totalMinor
  await LedgerEntry.create({
    organisationId: order.organisationId, orderId: order.id, kind: 'credit', amountMinor: -amountMinor, reference: orderReference(order.id),
    description: `${part ? 'Lines not yet sent cancelled' : 'Order cancelled'}: ${order.paymentState === 'on_account' ? 'credited to the account' : 'payment to be refunded'}`,
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
