/**
 * GET /api/vehicles/:id -> the vehicle with its original-equipment brakes per axle (`brakes[]`, each with the
 * option `qualifiers` it applies to), its option questions (`options[]`), master cylinder bore, pedal and booster
 * ratios, circuit split, kerb mass and tyre size. 404 for an unknown vehicle.
 */
import { VehicleIdParamsSchema } from '#shared/schemas/catalogue/params'
import { vehicleDetail } from '../../services/catalogue/vehicles'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'catalogue.view')
  const { id } = paramsWith(event, VehicleIdParamsSchema)
  const vehicle = await vehicleDetail(id)
  if (!vehicle) throw notFound(`Vehicle ${id}`)
  return vehicle
})
