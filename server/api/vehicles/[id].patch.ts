/**
 * PATCH /api/vehicles/:id  { steeringSide: 'left' | 'right' | null } -> { id, steeringSide }. Counter staff and the
 * admin record a catalogued vehicle's steering side, which sets the job card's bleeding order. Audited.
 * 401; 403 without `catalogue.edit`; 404 unknown vehicle; 422 (`data.fields.steeringSide`) another value.
 */
import { VehicleIdParamsSchema } from '#shared/schemas/catalogue/params'
import { VehiclePatchSchema } from '#shared/schemas/catalogue/upkeep'
import { patchVehicle } from '../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { id } = paramsWith(event, VehicleIdParamsSchema)
  const input = await bodyWith(event, VehiclePatchSchema)
  const v = await patchVehicle(user.id, id, input)
  return { id: v.id, steeringSide: v.steeringSide ?? null }
})
