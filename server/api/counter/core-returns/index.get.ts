/**
 * GET /api/counter/core-returns?status=&page=&pageSize= -> Page<CoreReturnView> (with garage): old units booked
 * to come back (default), or any status, most recently changed first. 401; 403 without `coreReturns.decide`; 422.
 */
import { CoreReturnListQuerySchema } from '#shared/schemas/orders'
import { counterCoreReturns } from '../../../services/core-returns/list'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'coreReturns.decide')
  return counterCoreReturns(queryWith(event, CoreReturnListQuerySchema))
})
