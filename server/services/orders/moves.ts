/**
 * Counter staff move an order along the queue: confirmed -> picking -> dispatched (what is picked goes, with its
 * invoice and delivery note; while lines are still to come the order stands as part sent, and picking starts
 * again when they are ready) -> delivered, or cancel what has not left. The garage is e-mailed at each step,
 * after the commit.
 */
import type { User } from '../../models/accounts'
import { Order } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { COUNTER_MOVES, ORDER_STATUS_LABELS, orderReference, type OrderDetail, type OrderStatus } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import type { PdfFonts } from '../pdf/document'
import { conflict, notFound } from '../errors'
import { runAfter, type After } from './after-commit'
import { cancelOrder } from './cancel'
import type { ViewClock } from './clock'
import { deliveryNotePdf } from './delivery-note-pdf'
import { dispatchPicked, type Sent } from './dispatch'
import { findAnyOrder, orderIncludes } from './find'
import { mailOrder } from './mail'
import { orderDetail } from './views'

export interface Move { to: OrderStatus; reason: string }

function refuseMove(from: OrderStatus, to: OrderStatus): never {
  const allowed = COUNTER_MOVES[from] ?? []
  const options = allowed.length ? ` It can move to: ${allowed.map((s) => `"${ORDER_STATUS_LABELS[s]}"`).join(' or ')}.` : ''
  throw conflict(`This order is "${ORDER_STATUS_LABELS[from]}", so it cannot move to "${ORDER_STATUS_LABELS[to]}".${options}`)
}

/** The e-mail for a step; a dispatch carries its delivery note and names its invoice and what follows. */
function stepMail(orderId: number, to: OrderStatus, fmt: Formats, fonts: PdfFonts, sent: Sent | null): () => Promise<unknown> {
  if (!sent) return () => mailOrder(orderId, to as 'picking' | 'delivered', fmt)
  return async () => {
    const pdf = await deliveryNotePdf(orderId, fmt, fonts, sent.dispatch.id)
    return mailOrder(orderId, 'dispatched', fmt, {
      attachments: [{ filename: `delivery-note-${orderReference(orderId)}${sent.dispatch.seq > 1 ? `-${sent.dispatch.seq}` : ''}.pdf`, content: pdf, contentType: 'application/pdf' }],
      invoiceReference: sent.invoice.reference, toFollow: sent.toFollow,
    })
  }
}

export async function moveOrder(orderId: number, move: Move, actor: Pick<User, 'id'>, fmt: Formats, fonts: PdfFonts, clock: ViewClock): Promise<OrderDetail> {
  const { to, reason } = move
  const after: After = []
  await withWrite(async (t) => {
    const o = await Order.findByPk(orderId, { include: orderIncludes(), transaction: t })
    if (!o) throw notFound('Order')
    if (!(COUNTER_MOVES[o.status] ?? []).includes(to)) refuseMove(o.status, to)
    if (to === 'cancelled') {
      after.push(...await cancelOrder(t, o, actor, reason, fmt, clock))
      return
    }
    const from = o.status
    let sent: Sent | null = null
    if (to === 'dispatched') {
      sent = await dispatchPicked(t, o, actor, clock, fmt)
    } else {
      if (to === 'picking') o.pickingAt = clock.now
      if (to === 'delivered') o.deliveredAt = clock.now
      o.status = to
      await o.save({ transaction: t })
    }
    await audit(t, {
      actorUserId: actor.id, organisationId: o.organisationId, action: `order.${o.status}`, entity: 'order', entityId: o.id,
      changes: { from, to: o.status, ...(sent ? { invoice: sent.invoice.reference, lines: sent.lines, toFollow: sent.toFollow } : {}) },
    })
    after.push(stepMail(o.id, to, fmt, fonts, sent))
  })
  await runAfter(after)
  return orderDetail(await findAnyOrder(orderId), 'counter', clock)
}
