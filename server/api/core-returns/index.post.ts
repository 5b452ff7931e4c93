/**
 * POST /api/core-returns { coreReturnId? | orderLineId?, quantity?, note? } -> CoreReturnView
 * The garage books an old unit (core) back against the deposit it paid; counter staff then accept or reject it.
 * 401; 403 without `coreReturns.book`; 404 not the caller's; 409 already booked/closed or the order has not
 * been dispatched yet; 422.
 */
import { CoreReturnBookSchema } from '#shared/schemas/orders'
import { bookCoreReturn } from '../../services/core-returns/booking'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'coreReturns.book')
  const input = await bodyWith(event, CoreReturnBookSchema)
  return bookCoreReturn(org.id, user, input)
})
