/**
 * GET /api/registrations/:registration -> RegistrationAnswer: the vehicle-data service's record of the mark mapped
 * to the catalogue (`vehicleId` when one vehicle matches, else `candidates`), remembered per garage.
 * 401; 403 without `vehicles.use`; 422 naming `registration` for a malformed mark; 404 the service does not know
 * it and 503 the service is down or slow, each with the message to show and `data.fallback` (what the mark's age
 * identifier tells) for the manual finder.
 */
import { RegistrationParamsSchema } from '#shared/schemas/garage-vehicles'
import { lookUpRegistration } from '../../services/vehicle-data/lookup'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'vehicles.use')
  const { registration } = paramsWith(event, RegistrationParamsSchema)
  return lookUpRegistration(org.id, registration, vehicleDataConfig(event), registrationFormat(event))
})
