/**
 * E-mails to the garage at each step of an order and of a core return. Always sent after the database
 * commit; a failed send is logged by sendMail and never undoes anything. Nitro only (uses runtime config).
 */
import type Mail from 'nodemailer/lib/mailer'
import { Branch, Organisation, User } from '../models/accounts'
import { CoreReturn, Order, OrderLine } from '../models/orders'
import { appLink, sendMail } from '../utils/mail'
import { formatMinor } from '../../shared/utils/money'
import { orderReference } from '../../shared/types/orders'

export type OrderMailKind = 'confirmed' | 'paid' | 'picking' | 'dispatched' | 'delivered' | 'cancelled' | 'lapsed' | 'refunded'

async function recipients(order: Pick<Order, 'organisationId' | 'placedByUserId'>): Promise<{ to: string[]; org: Organisation | null; name: string }> {
  const [org, placer] = await Promise.all([Organisation.findByPk(order.organisationId), User.findByPk(order.placedByUserId)])
  const to = [...new Set([placer?.status === 'active' ? placer.email : '', org?.email ?? ''].filter(Boolean).map((e) => e.toLowerCase()))]
  return { to, org, name: placer?.name?.split(' ')[0] ?? 'there' }
}

async function signature(): Promise<string> {
  const d = await Organisation.findOne({ where: { kind: 'distributor' }, attributes: ['name'] })
  return d ? `Boreline, for ${d.name}` : 'Boreline'
}

function linesText(lines: OrderLine[], currency: string): string {
  return lines.map((l) => `  ${l.quantity} x ${l.sku}  ${l.description}  ${formatMinor(l.lineNetMinor, currency)}`).join('\n')
}

/** Sends the e-mail for one step of an order. Returns false when nothing could be sent. */
export async function mailOrder(orderId: number, kind: OrderMailKind, extra: { reason?: string; attachments?: Mail.Attachment[]; amountMinor?: number } = {}): Promise<boolean> {
  const order = await Order.findByPk(orderId, { include: [{ model: OrderLine, as: 'lines' }, { model: Branch, as: 'branch' }] })
  if (!order) return false
  const { to, name } = await recipients(order)
  if (!to.length) return false
  const ref = orderReference(order.id)
  const money = (m: number) => formatMinor(m, order.currency)
  const link = appLink(`/orders/${order.id}`)
  const branch = order.branch?.name ?? 'the branch'
  const lines = linesText(order.lines ?? [], order.currency)
  const yours = order.garageReference ? ` (your reference ${order.garageReference})` : ''
  let subject: string
  let body: string
  switch (kind) {
    case 'confirmed':
      subject = `Order ${ref} confirmed on your trade account`
      body = `Your order${yours} for ${money(order.totalMinor)} is confirmed and charged to your trade account. ${branch} will pick it next.\n\n${lines}`
      break
    case 'paid':
      subject = `Payment received for order ${ref}`
      body = `We have received your card payment of ${money(order.totalMinor)} for order ${ref}${yours}. ${branch} will pick it next.\n\n${lines}`
      break
    case 'picking':
      subject = `Order ${ref} is being picked at ${branch}`
      body = `The counter at ${branch} has started picking order ${ref}${yours}.`
      break
    case 'dispatched':
      subject = `Order ${ref} is on its way`
      body = `Order ${ref}${yours} has left ${branch}. The delivery note is attached.\n\n${lines}`
      break
    case 'delivered':
      subject = `Order ${ref} delivered`
      body = `Order ${ref}${yours} has been delivered. Where a line carries a core deposit, book the old unit back from the order page to have the deposit returned.`
      break
    case 'cancelled': {
      const money2 = order.paymentMethod === 'card'
        ? (order.paymentState === 'unpaid' ? 'Nothing was charged.' : `The ${money(order.totalMinor)} you paid is being refunded to your card.`)
        : `The ${money(order.totalMinor)} has been credited back to your trade account.`
      subject = `Order ${ref} cancelled`
      body = `Order ${ref}${yours} has been cancelled${extra.reason ? `: ${extra.reason}` : '.'} ${money2}`
      break
    }
    case 'lapsed':
      subject = `Checkout for order ${ref} lapsed`
      body = `The card checkout for order ${ref}${yours} ran out before it was paid, so the parts went back on the shelf. You can pay again from the order page while stock lasts.`
      break
    case 'refunded':
      subject = `Refund sent for order ${ref}`
      body = `A refund of ${money(extra.amountMinor ?? order.totalMinor)} for order ${ref} has been sent to the card it was paid with. Banks usually show it within a few working days.`
      break
  }
  const text = `Hello ${name},\n\n${body}\n\nSee the order: ${link}\n\n${await signature()}`
  return sendMail({ to, subject, text, ...(extra.attachments ? { attachments: extra.attachments } : {}) })
}

/** Sends the decision on a core return. */
export async function mailCoreReturn(coreReturnId: number): Promise<boolean> {
  const cr = await CoreReturn.findByPk(coreReturnId, { include: [{ model: OrderLine, as: 'line' }, { model: Order, as: 'order' }] })
  if (!cr || !cr.order) return false
  const { to, name } = await recipients(cr.order)
  if (!to.length) return false
  const ref = orderReference(cr.orderId)
  const money = (m: number) => formatMinor(m, cr.order!.currency)
  const what = `${cr.quantityBooked ?? cr.quantityExpected} x ${cr.line?.sku ?? 'old unit'}`
  let subject: string
  let body: string
  if (cr.status === 'accepted') {
    const where = cr.order.paymentMethod === 'card' ? 'refunded to the card the order was paid with' : 'credited to your trade account'
    subject = `Old unit accepted: ${money(cr.creditedMinor ?? 0)} deposit returned (order ${ref})`
    body = `The counter accepted the old unit you sent back (${what}). Its deposit of ${money(cr.creditedMinor ?? 0)} has been ${where}.`
  } else {
    subject = `Old unit not accepted (order ${ref})`
    body = `The counter could not accept the old unit you sent back (${what}): ${cr.reason ?? 'no reason given'}. The deposit stays charged. Call the branch if you think this is wrong.`
  }
  const text = `Hello ${name},\n\n${body}\n\nSee the order: ${appLink(`/orders/${cr.orderId}`)}\n\n${await signature()}`
  return sendMail({ to, subject, text })
}
