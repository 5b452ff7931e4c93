/**
 * GET /api/core-returns?status=&page=&pageSize= -> Page<CoreReturnView>: the caller's garage's old units due back,
 * booked and decided (all but `void` unless asked), most recently changed first. 401; 403 without
 * `coreReturns.book`; 422.
 */
import { CoreReturnListQuerySchema } from '#shared/schemas/orders'
import { garageCoreReturns } from '../../services/core-returns/list'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'coreReturns.book')
  return garageCoreReturns(org.id, queryWith(event, CoreReturnListQuerySchema))
})
