/**
 * GET /api/calculations/prefill?vehicleId=<id>&sku=<part>&opt.<option key>=<value>
 * -> the bore-check body built from the vehicle's original-equipment data and, for a master cylinder, caliper or
 *    wheel cylinder SKU, the replacement from that part's specifications; plus the option questions, the OE wear
 *    limits per axle (for the inspection form), what the data lacks (`missing`), the defaults used
 *    (`assumptions`) and plain notes. Nothing is computed here: POST /api/calculations/hydraulics does that.
 * 401 signed out; 422 bad query (`vehicleId`, `sku`, `opt.<key>`); 404 unknown vehicle or part.
 */
import { PrefillQuerySchema, answersFromQuery } from '#shared/schemas/catalogue/vehicle-queries'
import { buildPrefill } from '../../services/prefill'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'calculations.use')
  const query = queryWith(event, PrefillQuerySchema)
  return buildPrefill(query.vehicleId, query.sku, answersFromQuery(getQuery(event)))
})
