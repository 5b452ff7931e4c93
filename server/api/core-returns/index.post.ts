/**
 * POST /api/core-returns { coreReturnId? | orderLineId?, quantity?, note? } -> CoreReturnView
 * The garage books an old unit (core) back against the deposit it paid; counter staff then accept or reject it.
 * 401; 403 without `coreReturns.book`; 404 not the caller's; 409 already booked/closed or the order has not
 * been dispatched yet; 422.
 */
import { CoreReturnBookSchema } from '#shared/schemas/orders'
import { bookCoreReturn } from '../../services/core-returns'
import { coreReturnView } from '../../services/orders'
import { withWrite } from '../../utils/db'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'coreReturns.book')
  const input = await bodyWith(event, CoreReturnBookSchema)
  const cr = await withWrite((t) => bookCoreReturn(t, org.id, user, input))
  return coreReturnView(cr, cr.line)
})
