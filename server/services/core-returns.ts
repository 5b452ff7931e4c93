/**
 * Core returns on the garage's side: listing what is due back and booking an old unit to go back.
 * (The counter's decision lives in payments.ts because accepting one may refund through the payment service.)
 * Plain Node.
 */
import { Op, type Transaction, type WhereOptions } from 'sequelize'
import { Organisation, type User } from '../models/accounts'
import { CoreReturn, Order, OrderLine } from '../models/orders'
import { audit } from '../utils/audit'
import { coreReturnView } from './orders'
import type { CoreReturnStatus, CoreReturnView } from '../../shared/types/orders'
import { invalidInput, notFound, conflict } from './errors'

/** Orders whose parts have left the branch: only then can the old units come back. */
const BOOKABLE_ORDER_STATUSES = ['dispatched', 'delivered']

export async function listCoreReturns(where: WhereOptions<CoreReturn>, withGarage: boolean): Promise<CoreReturnView[]> {
  const rows = await CoreReturn.findAll({
    where,
    include: [
      { model: OrderLine, as: 'line' },
      ...(withGarage ? [{ model: Organisation, as: 'organisation', attributes: ['id', 'name'] }] : []),
    ],
    order: [['updatedAt', 'DESC'], ['id', 'DESC']],
    limit: 500,
  })
  return rows.map((r) => coreReturnView(r, r.line, withGarage ? r.organisation?.name : undefined))
}

export function statusFilter(status: CoreReturnStatus | undefined, fallback: CoreReturnStatus[]): WhereOptions<CoreReturn> {
  return { status: status ? status : { [Op.in]: fallback } }
}

export interface BookInput { coreReturnId?: number; orderLineId?: number; quantity?: number; note: string }

/** The garage books an expected old unit back (in the caller's write transaction). */
export async function bookCoreReturn(t: Transaction, organisationId: number, user: Pick<User, 'id'>, input: BookInput): Promise<CoreReturn> {
  const where = input.coreReturnId !== undefined ? { id: input.coreReturnId, organisationId } : { orderLineId: input.orderLineId!, organisationId }
  const cr = await CoreReturn.findOne({ where, include: [{ model: Order, as: 'order' }, { model: OrderLine, as: 'line' }], transaction: t })
  if (!cr || !cr.order) throw notFound('Core return')
  if (cr.status !== 'expected') {
    throw conflict(cr.status === 'booked' ? 'This old unit is already booked to come back.' : 'This core return is closed.')
  }
  if (!BOOKABLE_ORDER_STATUSES.includes(cr.order.status)) {
    throw conflict('Book the old unit back once the order has been dispatched.')
  }
  const quantity = input.quantity ?? cr.quantityExpected
  if (quantity > cr.quantityExpected) throw invalidInput({ quantity: `At most ${cr.quantityExpected} can come back on this line.` })
  cr.status = 'booked'
  cr.quantityBooked = quantity
  cr.garageNote = input.note
  cr.bookedAt = new Date()
  cr.bookedByUserId = user.id
  await cr.save({ transaction: t })
  await audit(t, { actorUserId: user.id, organisationId, action: 'core_return.book', entity: 'core_return', entityId: cr.id, changes: { quantity } })
  return cr
}
