/**
 * POST /api/garage/vehicles  { registration?, vin?, vehicleId?, answers?, built?, customerId? | customer?: { name,
 * email?, phone?, reminderConsent?, consentSource? }, odometer?: { reading, unit, readOn? }, notes? }
 * Adds a vehicle to the caller's garage: at least a registration or a VIN. -> 201 GarageVehicleDetail.
 * 401 signed out; 403 without `vehicles.use`; 404 `customerId` not one of the garage's owners; 409 (`data.fields`)
 * registration or VIN already on another of the garage's vehicles; 422 with `data.fields` (a malformed
 * registration or VIN, a wrong check digit where the region requires it, an answer the vehicle does not ask).
 */
import { GarageVehicleCreateSchema } from '#shared/schemas/garage-vehicles'
import { createGarageVehicle } from '../../../services/garage-vehicles/register'
import { detailOf } from '../../../services/garage-vehicles/views'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'vehicles.use')
  const body = await bodyWith(event, GarageVehicleCreateSchema)
  const v = await createGarageVehicle({ userId: user.id, organisationId: org.id }, body)
  setResponseStatus(event, 201)
  return detailOf(v.id)
})
