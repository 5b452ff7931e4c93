/**
 * GET /api/admin/accounts?status=approved|suspended|pending|rejected|all&q=&sort=&page=&pageSize=
 * -> { data: GarageSummary[], meta }. Every garage by default, by name. Distributor staff (counter staff
 * read terms when working orders; only the admin changes them).
 */
import { GarageListQuerySchema } from '#shared/schemas/accounts'
import { listGarages } from '../../../services/garages'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'accounts.view')
  const query = queryWith(event, GarageListQuerySchema)
  return listGarages(query, { status: 'all', sort: 'name' })
})
