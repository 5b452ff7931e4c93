/** The garage is told what the counter decided on its return, after the commit. Nitro only (the e-mail). */
import { Order, OrderLine } from '../../models/orders'
import { IssuedDocument, PartReturn } from '../../models/counter'
import { returnReference } from '../../../shared/types/returns'
import type { Formats } from '../../../shared/utils/format'
import { sendToGarage } from '../orders/mail'

export async function mailReturnDecision(id: number, fmt: Formats): Promise<boolean> {
  const r = await PartReturn.findByPk(id, { include: [{ model: Order, as: 'order' }, { model: OrderLine, as: 'line' }, { model: IssuedDocument, as: 'creditNote' }] })
  if (!r?.order) return false
  const ref = returnReference(r.id)
  const what = `${r.quantity} x ${r.line?.sku ?? 'part'}`
  if (r.status === 'rejected') {
    return sendToGarage(r.order, `Return ${ref} not accepted`,
      `The counter could not accept the parts you sent back (${what}): ${r.decisionReason ?? 'no reason given'}. Nothing has been credited. Call the branch if you think this is wrong.`)
  }
  const credit = fmt.money(r.creditedMinor ?? 0)
  const where = r.order.paymentMethod === 'card' ? 'refunded to the card the order was paid with' : 'credited to your trade account'
  const part = r.status === 'part_accepted' ? `${r.acceptedQuantity} of the ${r.quantity} accepted: ${r.decisionReason ?? ''}`.trim() : 'all accepted'
  return sendToGarage(r.order, `Return ${ref}: ${credit} credited (credit note ${r.creditNote?.reference ?? ''})`,
    `The counter received the parts you sent back (${what}), ${part}. Credit note ${r.creditNote?.reference ?? ''} for ${credit} is in your documents; the amount has been ${where}.`)
}
