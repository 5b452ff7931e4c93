/**
 * GET /api/vehicles/facets?make=&model=&year= -> counts per step of the vehicle finder:
 * `{ selection, makes: [{ value, count }], models | null, years: [{ value, count }] | null, variants | null }`.
 * `count` is the number of vehicles (engine/variants) under that choice; a variant carries `partCount` and
 * `questionCount`. A model needs a make and a year a model (422 naming the missing one).
 */
import { VehicleFacetsQuerySchema } from '#shared/schemas/catalogue/vehicle-queries'
import { catalogueContext } from '../../services/catalogue/context'
import { facetsOf, vehicleSummaries } from '../../services/catalogue/vehicles'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'catalogue.view')
  const query = queryWith(event, VehicleFacetsQuerySchema)
  await catalogueContext(user, org) // drops the cached vehicle list when the catalogue changed
  return facetsOf(await vehicleSummaries(), query)
})
