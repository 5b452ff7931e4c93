/**
 * PATCH /api/counter/core-returns/:id { status: "accepted" | "rejected", reason? (required to reject) }
 * Accepting returns the deposit: refunded through the payment service for card orders, credited to the trade
 * account otherwise; the garage is e-mailed either way. -> CoreReturnView.
 * 401; 403 without `coreReturns.decide`; 404; 409 not booked yet or already decided; 422.
 */
import { CoreReturnDecisionSchema, CoreReturnParamsSchema } from '#shared/schemas/orders'
import { CoreReturn, OrderLine } from '../../../models/orders'
import { Organisation } from '../../../models/accounts'
import { coreReturnView } from '../../../services/orders'
import { decideCoreReturn } from '../../../services/payments'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'coreReturns.decide')
  const { id } = paramsWith(event, CoreReturnParamsSchema)
  const { status, reason } = await bodyWith(event, CoreReturnDecisionSchema)
  await decideCoreReturn(id, status, reason, user)
  const cr = await CoreReturn.findByPk(id, { include: [{ model: OrderLine, as: 'line' }, { model: Organisation, as: 'organisation', attributes: ['name'] }] })
  return coreReturnView(cr!, cr!.line, cr!.organisation?.name)
})
