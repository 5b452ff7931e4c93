/**
 * PATCH /api/counter/core-returns/:id { status: "accepted" | "rejected", reason? (required to reject) }
 * Accepting returns the deposit with its VAT on a credit note against the invoice that charged it: refunded
 * through the payment service for card orders, credited to the trade account otherwise; the garage is e-mailed
 * either way. -> CoreReturnView.
 * 401; 403 without `coreReturns.decide`; 404; 409 not booked yet or already decided; 422.
 */
import { CoreReturnDecisionSchema, CoreReturnParamsSchema } from '#shared/schemas/orders'
import { decideCoreReturn } from '../../../services/core-returns/decisions'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'coreReturns.decide')
  const { id } = paramsWith(event, CoreReturnParamsSchema)
  const decision = await bodyWith(event, CoreReturnDecisionSchema)
  return decideCoreReturn(id, decision, user, serverFormats(), requestClock(event))
})
