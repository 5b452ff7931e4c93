/** GET /api/admin/accounts/:id -> GarageDetail (terms, people, document, history). Distributor staff; 404 unknown. */
import { IdParamSchema } from '#shared/schemas/accounts'
import { can } from '#shared/utils/abilities'
import { findGarage, garageDetail } from '../../../../services/garages'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'accounts.view')
  const { id } = paramsWith(event, IdParamSchema)
  const org = await findGarage(id)
  if (!org) throw notFound('Trade account')
  return garageDetail(org, can(user.role, 'audit.view'))
})
