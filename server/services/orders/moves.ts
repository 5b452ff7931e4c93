/**
 * Counter staff move an order along the queue: confirmed -> picking -> dispatched (the delivery note goes with the
 * e-mail) -> delivered, or cancel it before it leaves. The garage is e-mailed at each step, after the commit.
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
import { deliveryNotePdf } from './delivery-note-pdf'
import { findAnyOrder, orderIncludes } from './find'
import { mailOrder } from './mail'
import { orderDetail } from './views'

export interface Move { to: OrderStatus; reason: string }

function refuseMove(from: OrderStatus, to: OrderStatus): never {
  const allowed = COUNTER_MOVES[from] ?? []
  const options = allowed.length ? ` It can move to: ${allowed.map((s) => `"${ORDER_STATUS_LABELS[s]}"`).join(' or ')}.` : ''
  throw conflict(`This order is "${ORDER_STATUS_LABELS[from]}", so it cannot move to "${ORDER_STATUS_LABELS[to]}".${options}`)
}

/** The e-mail for a step; a dispatch carries the delivery note. */
function stepMail(orderId: number, to: OrderStatus, fmt: Formats, fonts: PdfFonts): () => Promise<unknown> {
  if (to !== 'dispatched') return () => mailOrder(orderId, to as 'picking' | 'delivered', fmt)
  return async () => {
    const pdf = await deliveryNotePdf(orderId, fmt, fonts)
    return mailOrder(orderId, 'dispatched', fmt, { attachments: [{ filename: `delivery-note-${orderReference(orderId)}.pdf`, content: pdf, contentType: 'application/pdf' }] })
  }
}

export async function moveOrder(orderId: number, move: Move, actor: Pick<User, 'id'>, fmt: Formats, fonts: PdfFonts): Promise<OrderDetail> {
  const { to, reason } = move
  const after: After = []
  await withWrite(async (t) => {
    const o = await Order.findByPk(orderId, { include: orderIncludes(), transaction: t })
    if (!o) throw notFound('Order')
    if (!(COUNTER_MOVES[o.status] ?? []).includes(to)) refuseMove(o.status, to)
    if (to === 'cancelled') {
      after.push(...await cancelOrder(t, o, actor, reason, fmt))
      return
    }
    const now = new Date()
    if (to === 'picking') o.pickingAt = now
    if (to === 'dispatched') o.dispatchedAt = now
    if (to === 'delivered') o.deliveredAt = now
    const from = o.status
    o.status = to
    await o.save({ transaction: t })
    await audit(t, { actorUserId: actor.id, organisationId: o.organisationId, action: `order.${to}`, entity: 'order', entityId: o.id, changes: { from, to } })
    after.push(stepMail(o.id, to, fmt, fonts))
  })
  await runAfter(after)
  return orderDetail(await findAnyOrder(orderId), 'counter')
}
