/**
 * GET /api/counter/core-returns?status= -> { data: CoreReturnView[] (with garage) }: old units booked to come
 * back (default), or any status. 401; 403 without `coreReturns.decide`; 422.
 */
import { CoreReturnListQuerySchema } from '#shared/schemas/orders'
import { listCoreReturns, statusFilter } from '../../../services/core-returns'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'coreReturns.decide')
  const { status } = queryWith(event, CoreReturnListQuerySchema)
  return { data: await listCoreReturns(statusFilter(status, ['booked']), true) }
})
