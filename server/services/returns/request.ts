/**
 * The garage asks to send parts back from a sent, invoiced line: how many, why (wrong part ordered, not needed,
 * faulty: then when it was fitted, the mileage and the fault, with photos added after), within the period that
 * reason allows. The restocking charge that applies is fixed now, so the garage sees it before sending anything.
 * Units already asked back (and not turned down) cannot be asked twice. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import type { User } from '../../models/accounts'
import { Order, OrderLine } from '../../models/orders'
import { Dispatch, IssuedDocument, PartReturn } from '../../models/counter'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { ReturnRequestInput } from '../../../shared/schemas/returns'
import type { ReturnView, ReturnableLine } from '../../../shared/types/returns'
import type { Formats } from '../../../shared/utils/format'
import { conflict, invalidInput, notFound } from '../errors'
import type { ViewClock } from '../orders/clock'
import { counterSettings } from '../orders/counter-settings'
import { localDate } from '../orders/zoned-time'
import { returnTerms } from './rules'
import { findVisibleReturn, returnView } from './views'

/** Units of a line already asked back and not turned down. */
export async function askedBack(orderLineId: number, t?: Transaction): Promise<number> {
  const n = await PartReturn.sum('quantity', { where: { orderLineId, status: { [Op.ne]: 'rejected' } }, transaction: t })
  return Number(n ?? 0)
}

/** What may come back from one of the garage's sent lines (the return form), or 404. */
export async function returnableLine(organisationId: number, orderLineId: number, clock: ViewClock): Promise<ReturnableLine> {
  const line = await OrderLine.findOne({ where: { id: orderLineId }, include: [{ model: Order, as: 'order', where: { organisationId }, attributes: ['id'] }] })
  if (!line || line.state !== 'dispatched' || !line.dispatchId) throw notFound('Order line')
  const dispatch = (await Dispatch.findByPk(line.dispatchId))!
  const s = counterSettings()
  const day = (n: number) => localDate(new Date(dispatch.dispatchedAt.getTime() + n * 86_400_000), clock.timeZone)
  return {
    orderLineId: line.id, sku: line.sku, description: line.description, returnableQuantity: Math.max(0, line.quantity - await askedBack(line.id)),
    dispatchedAt: dispatch.dispatchedAt.toISOString(), returnBy: day(s.returnDays), warrantyBy: day(s.warrantyDays),
    restockingFrom: day(s.restockingAfterDays + 1), restockingBp: s.restockingBp,
  }
}

export async function requestReturn(organisationId: number, user: Pick<User, 'id'>, input: ReturnRequestInput, clock: ViewClock, fmt: Formats): Promise<ReturnView> {
  const id = await withWrite(async (t) => {
    const line = await OrderLine.findOne({
      where: { id: input.orderLineId }, include: [{ model: Order, as: 'order', where: { organisationId } }], transaction: t,
    })
    if (!line?.order) throw notFound('Order line')
    if (line.state !== 'dispatched' || !line.dispatchId) throw conflict('Only parts that have been sent can come back.')
    const invoice = await IssuedDocument.findOne({ where: { dispatchId: line.dispatchId, kind: 'invoice' }, transaction: t })
    if (!invoice) throw conflict('This part was sent before invoices were issued here: please call the counter to return it.')
    const dispatch = (await Dispatch.findByPk(line.dispatchId, { transaction: t }))!
    const terms = returnTerms(input.reason, dispatch.dispatchedAt, clock.now, counterSettings(), clock.timeZone)
    if (!terms.allowed) {
      throw invalidInput({ reason: `This part was sent on ${fmt.day(dispatch.dispatchedAt)}: ${input.reason === 'faulty' ? 'warranty claims' : 'wrong or unneeded parts'} come back within ${terms.limitDays} days of delivery.` })
    }
    if (input.fittedOn) {
      const sentDay = localDate(dispatch.dispatchedAt, clock.timeZone)
      if (input.fittedOn < sentDay || input.fittedOn > localDate(clock.now, clock.timeZone)) {
        throw invalidInput({ fittedOn: `The part was fitted between ${fmt.day(dispatch.dispatchedAt)} (when it was sent) and today.` })
      }
    }
    const left = line.quantity - await askedBack(line.id, t)
    if (input.quantity > left) {
      throw invalidInput({ quantity: left > 0 ? `At most ${left} of ${line.sku} can still come back from this line.` : `All ${line.quantity} of ${line.sku} have already been asked back.` })
    }
    const faulty = input.reason === 'faulty'
    const r = await PartReturn.create({
      organisationId, orderId: line.orderId, orderLineId: line.id, invoiceId: invoice.id, reason: input.reason, quantity: input.quantity,
      note: input.note, fittedOn: faulty ? input.fittedOn ?? null : null, mileage: faulty ? input.mileage ?? null : null, fault: faulty ? input.fault ?? null : null,
      status: 'requested', restockingBp: terms.restockingBp, requestedByUserId: user.id,
    }, { transaction: t })
    await audit(t, {
      actorUserId: user.id, organisationId, action: 'return.requested', entity: 'part_return', entityId: r.id,
      changes: { line: line.id, sku: line.sku, quantity: input.quantity, reason: input.reason, restockingBp: terms.restockingBp },
    })
    return r.id
  })
  return returnView(await findVisibleReturn(id, organisationId))
}
