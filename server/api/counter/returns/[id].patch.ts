/**
 * PATCH /api/counter/returns/:id { status: "accepted" | "rejected", quantity?, reason? } -> ReturnView
 * The counter received the parts: accepts all (or `quantity` of them, with the reason) or none (with the reason).
 * What is accepted is credited on a credit note against the invoice that charged it (less any restocking charge);
 * wrong and unneeded parts go back on the shelf, faulty ones are settled as a warranty claim; a card order is
 * refunded. The garage is e-mailed. 401; 403 without `returns.decide`; 404; 409 already decided; 422.
 */
import { ReturnDecisionSchema, ReturnParamsSchema } from '#shared/schemas/returns'
import { decideReturn } from '../../../services/returns/decide'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'returns.decide')
  const { id } = paramsWith(event, ReturnParamsSchema)
  const input = await bodyWith(event, ReturnDecisionSchema)
  return decideReturn(id, input, user, requestClock(event), serverFormats())
})
