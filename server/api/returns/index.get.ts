/**
 * GET /api/returns?status=&page=&pageSize= -> Page<ReturnView>: the caller's garage's returns, newest first.
 * 401; 403 without `returns.request`; 422 bad query.
 */
import { ReturnListQuerySchema } from '#shared/schemas/returns'
import { listReturns } from '../../services/returns/list'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'returns.request')
  return listReturns(org.id, queryWith(event, ReturnListQuerySchema))
})
