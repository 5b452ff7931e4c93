/**
 * GET /api/admin/trade-applications?status=pending|approved|rejected|suspended|all&q=&sort=&page=&pageSize=
 * -> { data: GarageSummary[], meta: { page, pageSize, total } }. The queue defaults to pending, oldest first.
 * Distributor admin only.
 */
import { GarageListQuerySchema } from '#shared/schemas/accounts'
import { listGarages } from '../../../services/garages'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'accounts.decide')
  const query = queryWith(event, GarageListQuerySchema)
  return listGarages(query, { status: 'pending', sort: 'submitted' })
})
