/** The garage books an expected old unit (core) back against the deposit it paid; the counter then decides. Plain Node. */
import type { User } from '../../models/accounts'
import { CoreReturn, Order, OrderLine } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { CoreReturnView } from '../../../shared/types/orders'
import { invalidInput, notFound, conflict } from '../errors'
import { coreReturnView } from '../orders/views'

/** Orders whose parts have left the branch: only then can the old units come back. */
const BOOKABLE_ORDER_STATUSES = ['dispatched', 'delivered']

export interface BookInput { coreReturnId?: number; orderLineId?: number; quantity?: number; note: string }

export function bookCoreReturn(organisationId: number, user: Pick<User, 'id'>, input: BookInput): Promise<CoreReturnView> {
  return withWrite(async (t) => {
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
    return coreReturnView(cr, cr.line)
  })
}
