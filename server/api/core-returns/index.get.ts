/**
 * GET /api/core-returns?status= -> { data: CoreReturnView[] }: the caller's garage's old units due back,
 * booked and decided (all but `void` unless asked). 401; 403 without `coreReturns.book`; 422.
 */
import { CoreReturnListQuerySchema } from '#shared/schemas/orders'
import { listCoreReturns, statusFilter } from '../../services/core-returns'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'coreReturns.book')
  const { status } = queryWith(event, CoreReturnListQuerySchema)
  const data = await listCoreReturns({ organisationId: org.id, ...statusFilter(status, ['expected', 'booked', 'accepted', 'rejected']) }, false)
  return { data }
})
