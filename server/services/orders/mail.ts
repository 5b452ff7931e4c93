/**
 * E-mails to the garage at each step of an order and of a core return. Always sent after the database
 * commit; a failed send is logged by sendMail and never undoes anything. Nitro only (uses runtime config).
 */
import type Mail from 'nodemailer/lib/mailer'
import { Branch, Organisation, User } from '../../models/accounts'
import { CoreReturn, Order, OrderLine } from '../../models/orders'
import { appLink, sendMail } from '../../utils/mail'
import { orderReference } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'

export type OrderMailKind = 'confirmed' | 'paid' | 'picking' | 'dispatched' | 'delivered' | 'cancelled' | 'lapsed' | 'refunded'

export interface OrderMailExtra {
  reason?: string
  attachments?: Mail.Attachment[]
  amountMinor?: number
  /** a dispatch: its invoice, and how many lines are still to come */
  invoiceReference?: string
  toFollow?: number
}

/** The person who placed the order (while active) and the garage's own address, greeted by first name. */
export async function sendToGarage(
  order: Pick<Order, 'id' | 'organisationId' | 'placedByUserId'>, subject: string, body: string, attachments?: Mail.Attachment[],
): Promise<boolean> {
  const [org, placer, distributor] = await Promise.all([
    Organisation.findByPk(order.organisationId),
    User.findByPk(order.placedByUserId),
    Organisation.findOne({ where: { kind: 'distributor' }, attributes: ['name'] }),
  ])
  const to = [...new Set([placer?.status === 'active' ? placer.email : '', org?.email ?? ''].filter(Boolean).map((e) => e.toLowerCase()))]
  if (!to.length) return false
  const name = placer?.name?.split(' ')[0] ?? 'there'
  const signature = distributor ? `Boreline, for ${distributor.name}` : 'Boreline'
  const text = `Hello ${name},\n\n${body}\n\nSee the order: ${appLink(`/orders/${order.id}`)}\n\n${signature}`
  return sendMail({ to, subject, text, ...(attachments ? { attachments } : {}) })
}

function orderMessage(order: Order, kind: OrderMailKind, fmt: Formats, extra: OrderMailExtra): { subject: string; body: string } {
  const ref = orderReference(order.id)
  const total = fmt.money(order.totalMinor)
  const branch = order.branch?.name ?? 'the branch'
  const lines = (order.lines ?? []).map((l) => `  ${l.quantity} x ${l.sku}  ${l.description}  ${fmt.money(l.lineNetMinor)}`).join('\n')
  const yours = order.garageReference ? ` (your reference ${order.garageReference})` : ''
  switch (kind) {
    case 'confirmed':
      return { subject: `Order ${ref} confirmed on your trade account`, body: `Your order${yours} for ${total} is confirmed and charged to your trade account. ${branch} will pick it next.\n\n${lines}` }
    case 'paid':
      return { subject: `Payment received for order ${ref}`, body: `We have received your card payment of ${total} for order ${ref}${yours}. ${branch} will pick it next.\n\n${lines}` }
    case 'picking':
      return { subject: `Order ${ref} is being picked at ${branch}`, body: `The counter at ${branch} has started picking order ${ref}${yours}.` }
    case 'dispatched': {
      const sent = (order.lines ?? []).filter((l) => l.state === 'dispatched').map((l) => `  ${l.quantity} x ${l.sku}  ${l.description}`).join('\n')
      const invoice = extra.invoiceReference ? ` Invoice ${extra.invoiceReference} is in your documents.` : ''
      const rest = extra.toFollow ? `\n\n${extra.toFollow} line${extra.toFollow === 1 ? '' : 's'} still to come: the order page shows where each comes from and when.` : ''
      return { subject: `Order ${ref} is on its way`, body: `Order ${ref}${yours} has left ${branch}. The delivery note is attached.${invoice}\n\n${sent}${rest}` }
    }
    case 'delivered':
      return { subject: `Order ${ref} delivered`, body: `Order ${ref}${yours} has been delivered. Where a line carries a core deposit, book the old unit back from the order page to have the deposit returned.` }
    case 'cancelled': {
      const amount = fmt.money(extra.amountMinor ?? order.totalMinor)
      const money = order.paymentMethod === 'card'
        ? (order.paymentState === 'unpaid' ? 'Nothing was charged.' : `The ${amount} you paid for it is being refunded to your card.`)
        : `The ${amount} has been credited back to your trade account.`
      const what = order.status === 'cancelled' ? `Order ${ref}${yours} has been cancelled` : `The lines of order ${ref}${yours} that had not left have been cancelled`
      return { subject: `Order ${ref} cancelled`, body: `${what}${extra.reason ? `: ${extra.reason}` : '.'} ${money}` }
    }
    case 'lapsed':
      return { subject: `Checkout for order ${ref} lapsed`, body: `The card checkout for order ${ref}${yours} ran out before it was paid, so the parts went back on the shelf. You can pay again from the order page while stock lasts.` }
    case 'refunded':
      return { subject: `Refund sent for order ${ref}`, body: `A refund of ${fmt.money(extra.amountMinor ?? order.totalMinor)} for order ${ref} has been sent to the card it was paid with. Banks usually show it within a few working days.` }
  }
}

/** Sends the e-mail for one step of an order. Returns false when nothing could be sent. */
export async function mailOrder(orderId: number, kind: OrderMailKind, fmt: Formats, extra: OrderMailExtra = {}): Promise<boolean> {
  const order = await Order.findByPk(orderId, { include: [{ model: OrderLine, as: 'lines' }, { model: Branch, as: 'branch' }] })
  if (!order) return false
  const { subject, body } = orderMessage(order, kind, fmt, extra)
  return sendToGarage(order, subject, body, extra.attachments)
}

/** Sends the counter's decision on a core return. */
export async function mailCoreReturn(coreReturnId: number, fmt: Formats): Promise<boolean> {
  const cr = await CoreReturn.findByPk(coreReturnId, { include: [{ model: OrderLine, as: 'line' }, { model: Order, as: 'order' }] })
  if (!cr || !cr.order) return false
  const ref = orderReference(cr.orderId)
  const what = `${cr.quantityBooked ?? cr.quantityExpected} x ${cr.line?.sku ?? 'old unit'}`
  if (cr.status === 'accepted') {
    const where = cr.order.paymentMethod === 'card' ? 'refunded to the card the order was paid with' : 'credited to your trade account'
    const credit = fmt.money(cr.creditedMinor ?? 0)
    return sendToGarage(cr.order, `Old unit accepted: ${credit} deposit returned (order ${ref})`,
      `The counter accepted the old unit you sent back (${what}). Its deposit of ${credit} has been ${where}.`)
  }
  return sendToGarage(cr.order, `Old unit not accepted (order ${ref})`,
    `The counter could not accept the old unit you sent back (${what}): ${cr.reason ?? 'no reason given'}. The deposit stays charged. Call the branch if you think this is wrong.`)
}
