/**
 * GET /api/admin/trade-applications/:id -> GarageDetail (application fields, proof document, applicant,
 * decision history). Distributor admin only; 404 when no garage has this id.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { findGarage, garageDetail } from '../../../../services/garages'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'accounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const org = await findGarage(id)
  if (!org) throw notFound('Application')
  return garageDetail(org)
})
