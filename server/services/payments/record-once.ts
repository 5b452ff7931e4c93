/**
 * One payment event's effects in one write transaction, recorded under the event's id in that same transaction
 * (payment_events.event_id is UNIQUE): a redelivered event is acknowledged and changes nothing. Follow-up calls
 * and e-mails run only after the commit.
 */
import { UniqueConstraintError, type Transaction } from 'sequelize'
import { Order, PaymentEvent } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { orderIncludes } from '../orders/find'
import { runAfter, type After } from '../orders/after-commit'

export interface Effect { outcome: string; after?: After }
export interface Handled { duplicate: boolean; outcome: string }
export interface EventRef { id: string; type: string }

/** `evt` null: a reconciliation by the sweep or the checkout route, applied but not recorded as an event. */
export async function handleOnce(evt: EventRef | null, orderId: number | null, effect: (t: Transaction, order: Order | null) => Promise<Effect>): Promise<Handled> {
  const after: After = []
  let result: Handled
  try {
    result = await withWrite(async (t) => {
      if (evt) {
        const seen = await PaymentEvent.findOne({ where: { eventId: evt.id }, transaction: t })
        if (seen) return { duplicate: true, outcome: seen.outcome }
      }
      const order = orderId ? await Order.findByPk(orderId, { include: orderIncludes(), transaction: t }) : null
      const r = await effect(t, order)
      if (evt) await PaymentEvent.create({ eventId: evt.id, type: evt.type, orderId: order?.id ?? null, outcome: r.outcome.slice(0, 200) }, { transaction: t })
      after.push(...(r.after ?? []))
      return { duplicate: false, outcome: r.outcome }
    })
  } catch (err) {
    if (err instanceof UniqueConstraintError) return { duplicate: true, outcome: 'duplicate' }
    throw err
  }
  if (!result.duplicate) await runAfter(after)
  return result
}
