/**
 * PATCH /api/garage/vehicles/:id  { registration?, vin?, vehicleId?, answers?, built?, customerId?, customer?,
 * odometer?, notes? } -> GarageVehicleDetail. A new catalogue vehicle starts its answers afresh unless they come
 * with it; `customer` changes the owner's details and consent (stamped with the time and how it was given).
 * 401; 403 without `vehicles.use`; 404 not the garage's vehicle (or owner); 409 registration or VIN on another of
 * the garage's vehicles; 422 with `data.fields`.
 */
import { GarageVehicleUpdateSchema, IdParamsSchema } from '#shared/schemas/garage-vehicles'
import { updateGarageVehicle } from '../../../../services/garage-vehicles/register'
import { detailOf } from '../../../../services/garage-vehicles/views'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'vehicles.use')
  const { id } = paramsWith(event, IdParamsSchema)
  const body = await bodyWith(event, GarageVehicleUpdateSchema)
  const v = await updateGarageVehicle({ userId: user.id, organisationId: org.id }, id, body)
  return detailOf(v.id)
})
