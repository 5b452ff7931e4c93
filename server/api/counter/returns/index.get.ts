/**
 * GET /api/counter/returns?status=&page=&pageSize= -> Page<ReturnView> (with garage): returns waiting for the
 * counter by default, or any status, newest first. 401; 403 without `returns.decide`; 422.
 */
import { ReturnListQuerySchema } from '#shared/schemas/returns'
import { listReturns } from '../../../services/returns/list'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'returns.decide')
  return listReturns(null, queryWith(event, ReturnListQuerySchema), 'requested')
})
