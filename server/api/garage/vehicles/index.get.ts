/**
 * GET /api/garage/vehicles?q=&page=&pageSize= -> Page<GarageVehicleSummary>: the caller's garage's vehicles,
 * searched by registration, VIN (whole or part) or the owner's name; an exact registration or VIN comes first.
 * 401 signed out; 403 without `vehicles.use` (garage people only); 422 bad query.
 */
import { GarageVehicleListQuerySchema } from '#shared/schemas/garage-vehicles'
import { listGarageVehicles } from '../../../services/garage-vehicles/views'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'vehicles.use')
  return listGarageVehicles(org.id, queryWith(event, GarageVehicleListQuerySchema))
})
