/**
 * GET /api/returns/:id -> ReturnView: one of the caller's garage's returns. 401; 403 without `returns.request`;
 * 404 not found or another garage's.
 */
import { ReturnParamsSchema } from '#shared/schemas/returns'
import { findVisibleReturn, returnView } from '../../../services/returns/views'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'returns.request')
  const { id } = paramsWith(event, ReturnParamsSchema)
  return returnView(await findVisibleReturn(id, org.id))
})
