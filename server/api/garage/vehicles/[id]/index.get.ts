/**
 * GET /api/garage/vehicles/:id -> GarageVehicleDetail: the vehicle, its owner and consent, the remembered answers,
 * the VIN read, the finder's query for the parts that fit, and its follow-ups. The history is paged separately
 * (GET /api/garage/vehicles/:id/history).
 * 401 signed out; 403 without `vehicles.use`; 404 not one of the caller's garage's vehicles; 422 bad id.
 */
import { IdParamsSchema } from '#shared/schemas/garage-vehicles'
import { garageVehicleOf } from '../../../../services/garage-vehicles/register'
import { detailOf } from '../../../../services/garage-vehicles/views'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'vehicles.use')
  const { id } = paramsWith(event, IdParamsSchema)
  const v = await garageVehicleOf(org.id, id)
  return detailOf(v.id)
})
